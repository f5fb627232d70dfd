/**
 * Reading a revision upload: multer into memory with limits (nothing reaches the disk until the
 * whole request has been read and checked), multer's refusals turned into clear 400/413 answers,
 * and file types told apart by content, never by name or declared type.
 */
import type { Request, Response } from 'express';
import multer from 'multer';
import { UPLOAD_LIMITS } from '../../shared/api/revisions.js';
import { BadRequestError, HttpError } from '../http/errors.js';

export class PayloadTooLargeError extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(413, 'too_large', message, fields);
  }
}

export class UnsupportedFileError extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(415, 'unsupported_file_type', message, fields);
  }
}

const mb = (n: number) => `${Math.round(n / (1024 * 1024))} MB`;

const parser = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: UPLOAD_LIMITS.photo, files: UPLOAD_LIMITS.files, fields: 20, fieldSize: 512 * 1024, parts: 40, fieldNameSize: 100 },
}).any();

/** Runs multer on the request; every failure becomes an HttpError naming the field and the limit. */
export function readMultipart(req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    parser(req, res, (err?: unknown) => {
      if (!err) return resolve();
      if (err instanceof multer.MulterError) {
        const field = err.field ? `files.${err.field}` : 'files';
        switch (err.code) {
          case 'LIMIT_FILE_SIZE':
            return reject(new PayloadTooLargeError(`${err.field ?? 'A file'} is larger than the ${mb(UPLOAD_LIMITS.photo)} limit for any file.`, { [field]: `larger than ${mb(UPLOAD_LIMITS.photo)}` }));
          case 'LIMIT_FILE_COUNT':
            return reject(new PayloadTooLargeError(`Send at most ${UPLOAD_LIMITS.files} files with one revision.`, { files: `at most ${UPLOAD_LIMITS.files} files` }));
          case 'LIMIT_FIELD_VALUE':
            return reject(new PayloadTooLargeError(`The field ${err.field} is too long (at most 512 kB).`, { [`body.${err.field}`]: 'too long' }));
          default:
            return reject(new PayloadTooLargeError(`The upload has too many parts (${err.message}).`, { files: err.message }));
        }
      }
      return reject(
        new BadRequestError('The upload was cut off or damaged before it finished, so nothing was stored. Send it again.', { files: 'the upload did not arrive complete' }, 'upload_incomplete'),
      );
    });
  });
}

export type SniffedKind = 'json' | 'svg' | 'drawing' | 'dxf' | 'png' | 'jpeg' | 'binary' | 'text';

/** What a file is, by its bytes. */
export function sniff(data: Buffer): SniffedKind {
  if (data.length >= 8 && data.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'png';
  if (data.length >= 3 && data[0] === 0xff && data[1] === 0xd8 && data[2] === 0xff) return 'jpeg';
  const head = data.subarray(0, 4096);
  if (head.includes(0)) return 'binary';
  let text = head.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const t = text.trimStart();
  if (t.startsWith('{')) return 'json';
  if (/^0\s*\r?\n\s*SECTION\b/.test(t) || /^999\s*\r?\n/.test(t)) return 'dxf';
  if (/^(<\?xml[\s\S]*?\?>\s*)?(<!--[\s\S]*?-->\s*|<!DOCTYPE[^>]*>\s*)*<svg[\s>]/i.test(t)) {
    return /data-planewright-page/.test(data.toString('utf8')) ? 'drawing' : 'svg';
  }
  return 'text';
}

export const KIND_NAMES: Record<SniffedKind, string> = {
  json: 'a JSON document',
  svg: 'an SVG drawing',
  drawing: 'a drawing template',
  dxf: 'a DXF drawing',
  png: 'a PNG image',
  jpeg: 'a JPEG image',
  binary: 'a binary file',
  text: 'plain text',
};

/** The text of an uploaded file, without a UTF-8 byte-order mark; null when it is not UTF-8. */
export function textOf(data: Buffer): string | null {
  const s = new TextDecoder('utf-8', { fatal: false }).decode(data);
  if (s.includes('\uFFFD')) return null;
  return s.charCodeAt(0) === 0xfeff ? s.slice(1) : s;
}

export { mb };
