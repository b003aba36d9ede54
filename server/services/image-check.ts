import { fileTypeFromBuffer } from 'file-type';
import { AppError, badRequest } from '../lib/errors';

/**
 * How an uploaded picture is checked before anything is stored: by its bytes, never by its name
 * or the type the browser claimed. Bench photos and reference pictures on procedure steps share it.
 */

/** Pictures up to 8 MB (the error handler's message names the same figure). */
export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;
export const IMAGE_TYPES: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };

/** A name with a folder in it (or a parent reference) is refused rather than cleaned up silently. */
export function checkName(name: string, field = 'photo'): void {
  if (/[\\/]/.test(name) || name.includes('..') || name.includes('\0')) {
    throw badRequest(`The file name contains a folder path. Send the ${field} with a plain file name such as photo.jpg.`, [{ path: field, message: 'Plain file names only' }]);
  }
}

// Markup a browser would run if it ever took the file for a page. A camera picture never holds it
// (XMP metadata is XML, but none of these tags), so a picture that does is a polyglot.
const MARKUP = /<(?:script|html|svg|body|iframe|object|embed|!doctype|\?php)[\s/>]|javascript:/i;
const PNG_END = Buffer.from([0, 0, 0, 0, 0x49, 0x45, 0x4e, 0x44, 0xae, 0x42, 0x60, 0x82]);

/** A PNG ends with its IEND chunk, a WebP is as long as its RIFF header says; anything after is smuggled. */
function wholeImage(mime: string, bytes: Buffer): boolean {
  if (mime === 'image/png') return bytes.subarray(-PNG_END.length).equals(PNG_END);
  if (mime === 'image/webp') return bytes.length >= 12 && bytes.readUInt32LE(4) + 8 === bytes.length;
  return true; // a camera JPEG may carry more after its end (a second picture, a motion clip)
}

/** The type the bytes really are; a renamed document (SVG included), or a picture that is also a page or script, is refused. */
export async function imageType(buffer: Buffer, field: string): Promise<string> {
  const t = await fileTypeFromBuffer(buffer);
  if (!t || !IMAGE_TYPES[t.mime]) {
    throw new AppError(415, 'not_an_image', `The ${field} is not a JPEG, PNG or WebP picture (its contents say ${t ? t.mime : 'unknown'}). Take or pick a photo instead.`);
  }
  if (MARKUP.test(buffer.toString('latin1')) || !wholeImage(t.mime, buffer)) {
    throw new AppError(415, 'not_an_image', `The ${field} holds more than a picture (web page or script code, or data after the image). Take or pick the photo again.`);
  }
  return t.mime;
}
