/**
 * A part family's picture is a photograph or a drawing extract: PNG or JPEG, recognised by its
 * first bytes, never by the name or the browser's word for it (PNG signature: ISO/IEC 15948:2004
 * §5.2; JPEG SOI marker FF D8 followed by a marker FF: ITU-T T.81 Annex B).
 */
const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

export type PictureType = "image/png" | "image/jpeg";

export function sniffPicture(bytes: Uint8Array): PictureType | null {
  if (bytes.length >= PNG.length && PNG.every((b, i) => bytes[i] === b)) return "image/png";
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff)
    return "image/jpeg";
  return null;
}

/** A page's picture needs no print resolution: 5 MB holds a good phone photograph [practice]. */
export const PICTURE_MAX_BYTES = 5 * 1024 * 1024;

/** Why a picture is refused, or null when it is taken. */
export function pictureProblem(bytes: Uint8Array): string | null {
  if (bytes.byteLength === 0) return "The file is empty.";
  if (bytes.byteLength > PICTURE_MAX_BYTES)
    return `The picture is larger than ${PICTURE_MAX_BYTES / 1024 / 1024} MB: save it smaller.`;
  if (!sniffPicture(bytes)) return "The file is not a PNG or JPEG image.";
  return null;
}
