// File names as a card holds them: base names, file numbers, and names safe to show or store.
// Pure: no I/O.

const MAX_FILE_NUMBER_DIGITS = 15; // 15 digits always fit a double exactly
const MAX_NAME_LENGTH = 200; // well under the 255-byte limit of common file systems
// A copy marker some systems append when a name is taken: "frame-0042 (1).jpg".
const COPY_MARKER = /\s\(\d{1,4}\)$/;
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f]/g;
const INVISIBLE_FORMATTING = /[\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g;

/** The last path segment, whichever separator the uploading system used. */
export function lastPathSegmentOf(fileName: string): string {
  const slash = Math.max(fileName.lastIndexOf('/'), fileName.lastIndexOf('\\'));
  return slash >= 0 ? fileName.slice(slash + 1) : fileName;
}

/** Name without folders and without its last extension: "DCIM/FRN_0042.JPG" -> "FRN_0042". */
export function baseNameOf(fileName: string): string {
  const name = lastPathSegmentOf(fileName);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(0, dot) : name;
}

/** Lower-case extension without the dot, '' when there is none. */
export function extensionOf(fileName: string): string {
  const name = lastPathSegmentOf(fileName);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
}

/**
 * The camera's running file number: the trailing digits of the base name
 * ("FRN_0042.JPG" -> 42, "frame-0042 (1).jpg" -> 42). null when the base name ends in no digit.
 */
export function fileNumberOf(fileName: string): number | null {
  const base = baseNameOf(fileName).replace(COPY_MARKER, '');
  let start = base.length;
  while (start > 0 && base.charCodeAt(start - 1) >= 48 && base.charCodeAt(start - 1) <= 57) start -= 1;
  const digits = base.slice(start);
  if (digits.length === 0 || digits.length > MAX_FILE_NUMBER_DIGITS) return null;
  return Number(digits);
}

function shorten(name: string, maxLength: number): string {
  if (name.length <= maxLength) return name;
  const dot = name.lastIndexOf('.');
  const extension = dot > 0 && name.length - dot <= 10 ? name.slice(dot) : '';
  return name.slice(0, maxLength - extension.length) + extension;
}

/**
 * The name to show a person: the uploaded name without folders, control or bidi-override
 * characters (which could make "gpj.exe" read as "exe.jpg"), trimmed and NFC-normalised.
 */
export function displayNameOf(fileName: string): string {
  const cleaned = lastPathSegmentOf(fileName)
    .normalize('NFC')
    .replace(CONTROL_CHARACTERS, '')
    .replace(INVISIBLE_FORMATTING, '')
    .trim();
  return shorten(cleaned, MAX_NAME_LENGTH) || 'unnamed';
}

/**
 * A name safe on any disk, in object storage keys and inside zip files: ASCII letters, digits,
 * '.', '-' and '_' only, no leading dot, never empty. Not unique: callers prefix an id.
 */
export function storageNameOf(fileName: string): string {
  const ascii = displayNameOf(fileName)
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9._-]+/g, '_')
    .replace(/_{2,}/g, '_')
    .replace(/^[._]+/, '')
    .replace(/[._]+$/, '');
  return shorten(ascii, MAX_NAME_LENGTH) || 'unnamed';
}
