// Names of entries inside a bundle. A stack name is typed by a person and may be anything
// ("../../etc/passwd", "/abs", a name with control characters or a right-to-left override);
// what lands in the zip must be one plain path segment on every common file system.

const MAX_STACK_FOLDER_BYTES = 100;
const MAX_ENTRY_BYTES = 200;
const MAX_EXTENSION_CHARS = 10;

// C0/C1 controls and the bidirectional overrides/isolates that can disguise a name.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL_CHARS = /[\u0000-\u001F\u007F-\u009F\u200E\u200F\u202A-\u202E\u2066-\u2069]/g;
// A run of separators and dots that contains a separator, or any run of two or more dots.
const PATH_LIKE_RUNS = /[./\\]*[/\\][./\\]*|\.{2,}/g;
// Characters Windows refuses in file names.
const RESERVED_CHARS = /[:*?"<>|]/g;
const WINDOWS_DEVICE_NAMES = /^(con|prn|aux|nul|com[1-9]|lpt[1-9])(\..*)?$/i;

const utf8 = new TextEncoder();

function utf8Bytes(text: string): number {
  return utf8.encode(text).length;
}

function truncateUtf8(text: string, maxBytes: number): string {
  let bytes = 0;
  let out = '';
  for (const codePoint of text) {
    const size = utf8Bytes(codePoint);
    if (bytes + size > maxBytes) break;
    bytes += size;
    out += codePoint;
  }
  return out;
}

function cleanSegment(raw: string): string {
  return String(raw)
    .normalize('NFC')
    .replace(CONTROL_CHARS, '')
    .replace(PATH_LIKE_RUNS, '_')
    .replace(RESERVED_CHARS, '_')
    .replace(/\s+/g, ' ')
    .replace(/_{2,}/g, '_')
    .replace(/^[\s._-]+|[\s._]+$/g, '');
}

function guardDeviceName(name: string): string {
  return WINDOWS_DEVICE_NAMES.test(name) ? `_${name}` : name;
}

/** One folder name for a stack (also the stem of its renamed frames). Never empty. */
export function safeStackFolderName(stackName: string, fallback = 'stack'): string {
  const cleaned = truncateUtf8(cleanSegment(stackName), MAX_STACK_FOLDER_BYTES).replace(/[\s.]+$/, '');
  return guardDeviceName(cleaned.length > 0 ? cleaned : fallback);
}

/** A file-name extension without the dot: ASCII letters and digits only, lower case. */
export function safeExtension(ext: string): string {
  return String(ext)
    .replace(/^\.+/, '')
    .replace(/[^A-Za-z0-9]/g, '')
    .slice(0, MAX_EXTENSION_CHARS)
    .toLowerCase();
}

/** One file name inside a bundle folder; keeps a short extension when it has to shorten. */
export function safeEntryName(name: string, fallback = 'file'): string {
  const cleaned = cleanSegment(name);
  const dot = cleaned.lastIndexOf('.');
  const hasExtension = dot > 0 && cleaned.length - dot - 1 <= MAX_EXTENSION_CHARS;
  const stem = hasExtension ? cleaned.slice(0, dot) : cleaned;
  const ext = hasExtension ? safeExtension(cleaned.slice(dot + 1)) : '';
  const suffix = ext ? `.${ext}` : '';
  const shortStem = truncateUtf8(stem, MAX_ENTRY_BYTES - utf8Bytes(suffix)).replace(/[\s.]+$/, '');
  return guardDeviceName(`${shortStem.length > 0 ? shortStem : fallback}${suffix}`);
}

/** Digits of the frame number: three, or more when a stack has more than 999 frames. */
export function frameNumberDigits(frameCount: number): number {
  return Math.max(3, String(Math.max(0, Math.floor(frameCount))).length);
}

/** `<stack-name>_<NNN>.<ext>`: the RAW and the JPEG of one frame share the number. */
export function frameEntryName(stackFolderName: string, frameNumber: number, digits: number, ext: string): string {
  const cleanExt = safeExtension(ext);
  const number = String(frameNumber).padStart(digits, '0');
  return `${stackFolderName}_${number}${cleanExt ? `.${cleanExt}` : ''}`;
}

/** Makes `name` unique within `taken` by adding -2, -3 … before the extension; records it. */
export function claimUniqueName(name: string, taken: Set<string>): string {
  const key = (candidate: string) => candidate.toLowerCase();
  if (!taken.has(key(name))) {
    taken.add(key(name));
    return name;
  }
  const dot = name.lastIndexOf('.');
  const stem = dot > 0 ? name.slice(0, dot) : name;
  const suffix = dot > 0 ? name.slice(dot) : '';
  for (let n = 2; ; n += 1) {
    const candidate = `${stem}-${n}${suffix}`;
    if (!taken.has(key(candidate))) {
      taken.add(key(candidate));
      return candidate;
    }
  }
}
