/**
 * Photos of the built piece: decoded and re-encoded with jimp, which writes pixels only (no
 * EXIF, GPS or text chunks survive), plus a 320 px wide thumbnail.
 */
import { Jimp } from 'jimp';

export const THUMBNAIL_WIDTH = 320;

export interface ProcessedPhoto {
  image: Buffer;
  mediaType: 'image/jpeg' | 'image/png';
  thumbnail: Buffer;
}

export async function processPhoto(data: Buffer, kind: 'jpeg' | 'png'): Promise<ProcessedPhoto> {
  const img = await Jimp.read(data);
  const mediaType = kind === 'jpeg' ? 'image/jpeg' : 'image/png';
  const image = await img.getBuffer(mediaType);
  const thumb = img.clone();
  if (thumb.bitmap.width > THUMBNAIL_WIDTH) thumb.resize({ w: THUMBNAIL_WIDTH });
  const thumbnail = await thumb.getBuffer(mediaType);
  return { image, mediaType, thumbnail };
}
