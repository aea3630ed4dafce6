import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { Transform, type Readable, type TransformCallback } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { ZipArchive } from 'archiver';
import { z } from 'zod';
import {
  claimUniqueName,
  frameEntryName,
  frameNumberDigits,
  safeStackFolderName,
} from '@shared/bundle-names';
import { fileRoleSchema, sha256HexSchema, type ManifestFrame } from '@shared/schemas/manifest';
import { createAtomicWriteStream } from './atomic-file';
import { buildManifest, manifestCsv } from './bundle-manifest';

// Larger reads than the 64 KiB default: fewer hops through the hash, CRC and zip streams.
const READ_CHUNK_BYTES = 1 << 20;
// Metadata from cameras can hold zeros for "unknown"; the manifest records those as null.
const nullableNumber = z
  .number()
  .nullish()
  .transform((value) => (value !== null && value !== undefined && value > 0 ? value : null));

const bundleFileSchema = z.object({
  path: z.string().min(1),
  originalName: z.string(),
  ext: z.string(),
  sha256: sha256HexSchema,
  role: fileRoleSchema,
});

const bundleFrameSchema = z.object({
  order: z.number().int().nonnegative(),
  files: z.array(bundleFileSchema).min(1, 'a frame needs at least one file'),
  captureTimeIso: z.string().nullish(),
  exposureTimeS: nullableNumber,
  fNumber: nullableNumber,
  iso: nullableNumber,
  focalLengthMm: nullableNumber,
  flags: z.array(z.string()).optional(),
});

const bundleStackSchema = z.object({
  name: z.string(),
  frames: z.array(bundleFrameSchema),
  contactSheetPdfPath: z.string().min(1).nullish(),
  contactSheetJpegPath: z.string().min(1).nullish(),
  planText: z.string().nullish(),
});

export const writeBundleInputSchema = z.object({
  outPath: z.string().min(1),
  /** One folder per stack (session bundles). Defaults to true when there is more than one stack. */
  folder: z.boolean().optional(),
  stacks: z.array(bundleStackSchema).min(1, 'a bundle needs at least one stack'),
  generatedAt: z.date().optional(),
});

export type BundleStackInput = z.input<typeof bundleStackSchema>;
export type WriteBundleInput = z.input<typeof writeBundleInputSchema> & {
  onProgress?: (fraction: number) => void;
};
export interface WriteBundleResult {
  bytes: number;
  entries: string[];
}

type EntrySource =
  | { kind: 'file'; path: string; bytes: number; mtime: Date; expectedSha256: string | null; label: string }
  | { kind: 'buffer'; data: Buffer };
interface PlannedEntry {
  name: string;
  source: EntrySource;
}

async function statSource(path: string, label: string): Promise<{ bytes: number; mtime: Date }> {
  try {
    const info = await stat(path);
    if (!info.isFile()) throw new Error('not a regular file');
    return { bytes: info.size, mtime: info.mtime };
  } catch (error) {
    throw new Error(`bundle source ${label} cannot be read at ${path}: ${(error as Error).message}`, {
      cause: error,
    });
  }
}

async function planStack(
  stack: z.output<typeof bundleStackSchema>,
  folder: string | null,
  generatedAt: Date,
): Promise<PlannedEntry[]> {
  const stem = safeStackFolderName(stack.name);
  const prefix = folder ? `${folder}/` : '';
  const frames = [...stack.frames].sort((a, b) => a.order - b.order);
  const digits = frameNumberDigits(frames.length);
  const taken = new Set<string>();
  const entries: PlannedEntry[] = [];
  const manifestFrames: ManifestFrame[] = [];

  for (const [index, frame] of frames.entries()) {
    const number = index + 1;
    const files: ManifestFrame['files'] = [];
    for (const file of frame.files) {
      const label = `"${file.originalName}" (stack "${stack.name}", frame order ${frame.order})`;
      const { bytes, mtime } = await statSource(file.path, label);
      const newName = claimUniqueName(frameEntryName(stem, number, digits, file.ext), taken);
      entries.push({
        name: prefix + newName,
        source: { kind: 'file', path: file.path, bytes, mtime, expectedSha256: file.sha256, label },
      });
      files.push({ newName, originalName: file.originalName, role: file.role, sha256: file.sha256, bytes });
    }
    manifestFrames.push({
      number,
      stackOrder: frame.order,
      captureTime: frame.captureTimeIso ?? null,
      exposureTimeS: frame.exposureTimeS ?? null,
      fNumber: frame.fNumber ?? null,
      iso: frame.iso ?? null,
      focalLengthMm: frame.focalLengthMm ?? null,
      flags: frame.flags ?? [],
      files,
    });
  }

  const contactSheets: string[] = [];
  const sheets: Array<[string | null | undefined, string]> = [
    [stack.contactSheetPdfPath, 'contact-sheet.pdf'],
    [stack.contactSheetJpegPath, 'contact-sheet.jpg'],
  ];
  for (const [path, name] of sheets) {
    if (!path) continue;
    const label = `${name} of stack "${stack.name}"`;
    const { bytes, mtime } = await statSource(path, label);
    entries.push({ name: prefix + name, source: { kind: 'file', path, bytes, mtime, expectedSha256: null, label } });
    contactSheets.push(name);
  }
  const hasPlan = typeof stack.planText === 'string';
  if (hasPlan) entries.push({ name: `${prefix}plan.txt`, source: { kind: 'buffer', data: Buffer.from(stack.planText ?? '', 'utf8') } });

  const manifest = buildManifest({
    stackName: stack.name,
    folder,
    generatedAt: generatedAt.toISOString(),
    frames: manifestFrames,
    contactSheets,
    plan: hasPlan ? 'plan.txt' : null,
  });
  entries.push({ name: `${prefix}manifest.csv`, source: { kind: 'buffer', data: Buffer.from(manifestCsv(manifest), 'utf8') } });
  entries.push({
    name: `${prefix}manifest.json`,
    source: { kind: 'buffer', data: Buffer.from(`${JSON.stringify(manifest, null, 2)}\n`, 'utf8') },
  });
  return entries;
}

class HashingPassThrough extends Transform {
  private readonly hash = createHash('sha256');
  constructor(private readonly onBytes: (count: number) => void) {
    super({ highWaterMark: READ_CHUNK_BYTES });
  }
  override _transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback): void {
    this.hash.update(chunk);
    this.onBytes(chunk.length);
    callback(null, chunk);
  }
  digestHex(): string {
    return this.hash.digest('hex');
  }
}

function parseInput(input: WriteBundleInput): z.output<typeof writeBundleInputSchema> {
  const parsed = writeBundleInputSchema.safeParse(input);
  if (!parsed.success) throw new Error(`writeBundle: invalid input\n${z.prettifyError(parsed.error)}`);
  const { folder, stacks } = parsed.data;
  if (folder === false && stacks.length > 1) {
    throw new Error('writeBundle: a bundle of several stacks needs one folder per stack (folder: true)');
  }
  return parsed.data;
}

/**
 * Streams the stack(s) into a STORE-mode zip at outPath. The zip is written to a temporary
 * sibling and renamed only when complete; on any error the call rejects and leaves nothing.
 */
export async function writeBundle(input: WriteBundleInput): Promise<WriteBundleResult> {
  const { outPath, stacks, generatedAt = new Date(), folder } = parseInput(input);
  const useFolders = folder ?? stacks.length > 1;
  const takenFolders = new Set<string>();
  const planned: PlannedEntry[] = [];
  for (const stack of stacks) {
    const folderName = useFolders ? claimUniqueName(safeStackFolderName(stack.name), takenFolders) : null;
    planned.push(...(await planStack(stack, folderName, generatedAt)));
  }

  const totalBytes = planned.reduce((sum, e) => sum + (e.source.kind === 'file' ? e.source.bytes : e.source.data.length), 0);
  let doneBytes = 0;
  let lastReported = -1;
  const advance = (count: number) => {
    doneBytes += count;
    const fraction = totalBytes > 0 ? Math.min(1, doneBytes / totalBytes) : 1;
    if (fraction - lastReported >= 0.01 || fraction === 1) {
      lastReported = fraction;
      input.onProgress?.(fraction);
    }
  };

  const out = createAtomicWriteStream(outPath);
  const archive = new ZipArchive({ store: true });
  archive.on('error', () => undefined); // errors reach us through the pipeline below
  archive.on('warning', (warning) => archive.emit('error', warning));
  const piping = pipeline(archive, out.stream);
  piping.catch(() => undefined);

  let readFailure: Error | null = null;
  const appendEntry = async (entry: PlannedEntry): Promise<void> => {
    const { source } = entry;
    let stream: Readable | Buffer;
    let hasher: HashingPassThrough | null = null;
    if (source.kind === 'file') {
      hasher = new HashingPassThrough(advance);
      stream = hasher;
      pipeline(createReadStream(source.path, { highWaterMark: READ_CHUNK_BYTES }), hasher).catch((error: Error) => {
        readFailure ??= new Error(`bundle source ${source.label} failed while reading: ${error.message}`, { cause: error });
        archive.emit('error', readFailure);
      });
    } else {
      stream = source.data;
    }
    // Entries are appended one at a time, so the next 'entry' event is this one; waiting for it
    // keeps one source file open at a time however many frames a stack has.
    const added = new Promise<void>((resolve) => archive.once('entry', () => resolve()));
    archive.append(stream, { name: entry.name, date: source.kind === 'file' ? source.mtime : generatedAt, mode: 0o644 });
    await Promise.race([added, piping]);
    if (source.kind === 'buffer') advance(source.data.length);
    if (hasher && source.kind === 'file' && source.expectedSha256) {
      const actual = hasher.digestHex();
      if (actual !== source.expectedSha256) {
        throw new Error(
          `bundle source ${source.label} does not match its recorded SHA-256 (expected ${source.expectedSha256}, read ${actual}); the stored file changed`,
        );
      }
    }
  };

  try {
    for (const entry of planned) await appendEntry(entry);
    await Promise.race([archive.finalize(), piping]);
    await piping;
    await out.commit();
  } catch (error) {
    archive.abort();
    await out.abort();
    throw readFailure ?? error;
  }
  const { size } = await stat(outPath);
  return { bytes: size, entries: planned.map((e) => e.name) };
}
