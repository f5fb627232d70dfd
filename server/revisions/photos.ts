/**
 * Photos of the built piece: decoded and re-encoded with jimp, which writes pixels only (no
 * EXIF, GPS or text chunks survive), plus a 320 px wide thumbnail.
 */
import { Jimp } from 'jimp';

export const THUMBNAIL_WIDTH = 320;
/** Largest photo decoded (pixels): a small file can declare a huge image that would exhaust memory. */
export const MAX_PHOTO_PIXELS = 40_000_000;

/** Width and height from a PNG header or a JPEG frame header, without decoding; null if not found. */
export function imageSize(data: Buffer, kind: 'jpeg' | 'png'): { width: number; height: number } | null {
  if (kind === 'png') return data.length >= 24 ? { width: data.readUInt32BE(16), height: data.readUInt32BE(20) } : null;
  let i = 2;
  while (i + 9 < data.length) {
    if (data[i] !== 0xff) return null;
    const marker = data[i + 1];
    if (marker === 0xd8 || marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
      i += 2;
      continue;
    }
    const length = data.readUInt16BE(i + 2);
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      return { height: data.readUInt16BE(i + 5), width: data.readUInt16BE(i + 7) };
    }
    i += 2 + length;
  }
  return null;
}

export class PhotoTooLargeError extends Error {}

export interface ProcessedPhoto {
  image: Buffer;
  mediaType: 'image/jpeg' | 'image/png';
  thumbnail: Buffer;
}

/** Throws PhotoTooLargeError for images over {@link MAX_PHOTO_PIXELS}; other errors for unreadable data. */
export async function processPhoto(data: Buffer, kind: 'jpeg' | 'png'): Promise<ProcessedPhoto> {
  const size = imageSize(data, kind);
  if (!size || size.width === 0 || size.height === 0) throw new Error('no image size in the header');
  if (size.width * size.height > MAX_PHOTO_PIXELS) throw new PhotoTooLargeError(`${size.width} × ${size.height} pixels`);
  const img = await Jimp.read(data);
  const mediaType = kind === 'jpeg' ? 'image/jpeg' : 'image/png';
  const image = await img.getBuffer(mediaType);
  const thumb = img.clone();
  if (thumb.bitmap.width > THUMBNAIL_WIDTH) thumb.resize({ w: THUMBNAIL_WIDTH });
  const thumbnail = await thumb.getBuffer(mediaType);
  return { image, mediaType, thumbnail };
}
