import { execFileSync, spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { frameEntryName, safeEntryName, safeStackFolderName } from '@shared/bundle-names';
import { bundleManifestSchema } from '@shared/schemas/manifest';
import { writeBundle, type BundleStackInput } from '../../worker/lib/bundle';

// Outside checks: Info-ZIP's `unzip -t` / `unzip -Z` (/usr/bin/unzip) judge every bundle, and the
// checksums of extracted files are recomputed here from the bytes unzip wrote.

const workDir = mkdtempSync(join(tmpdir(), 'lamella-bundle-'));
afterAll(() => rmSync(workDir, { recursive: true, force: true }));
const utf8Env = { ...process.env, LC_ALL: 'C.UTF-8' };

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

let fileCounter = 0;
function makeSource(bytes: number, originalName: string, role: 'raw' | 'jpeg' | 'other') {
  const data = randomBytes(bytes);
  const path = join(workDir, `src-${(fileCounter += 1)}`);
  writeFileSync(path, data);
  const ext = originalName.split('.').pop() ?? '';
  return { path, originalName, ext, sha256: sha256(data), role };
}

function zipListing(zipPath: string): string[] {
  return execFileSync('/usr/bin/unzip', ['-Z1', zipPath], { env: utf8Env }).toString('utf8').split('\n').filter(Boolean);
}

function unzipTest(zipPath: string) {
  return spawnSync('/usr/bin/unzip', ['-t', zipPath], { env: utf8Env, encoding: 'utf8' });
}

function extract(zipPath: string): string {
  const dir = mkdtempSync(join(workDir, 'out-'));
  execFileSync('/usr/bin/unzip', ['-q', zipPath, '-d', dir], { env: utf8Env });
  return dir;
}

// Three pairs and a single; the app excluded order 3 and hands the rest over out of order.
function fernStack(): BundleStackInput {
  const frame = (order: number, names: string[], flags: string[] = []) => ({
    order,
    files: names.map((name) => makeSource(2000 + order * 37, name, name.endsWith('.jpg') ? 'jpeg' : 'raw')),
    captureTimeIso: `2026-05-03T06:12:${String(10 + order).padStart(2, '0')}.250+02:00`,
    exposureTimeS: 1 / 125,
    fNumber: 8,
    iso: 200,
    focalLengthMm: 100,
    flags,
  });
  return {
    name: 'Dew on fern, frond 2',
    frames: [
      frame(4, ['FERN_0104.raw', 'FERN_0104.jpg']),
      frame(1, ['FERN_0101.raw', 'FERN_0101.jpg']),
      frame(2, ['FERN_0102.raw', 'FERN_0102.jpg'], ['exposure-jump']),
      frame(5, ['FERN_0105.raw']),
    ],
    contactSheetPdfPath: makeSource(3000, 'sheet.pdf', 'other').path,
    contactSheetJpegPath: makeSource(3000, 'sheet.jpg', 'other').path,
    planText: 'Fern dew, f/8, 0.12 mm step, 40 frames\n',
  };
}

describe('writeBundle', { timeout: 30_000 }, () => {
  it('writes a zip that unzip -t accepts, with frames renamed in stack order and matching checksums', async () => {
    const stack = fernStack();
    const outPath = join(workDir, 'fern.zip');
    const progress: number[] = [];
    const result = await writeBundle({ outPath, stacks: [stack], onProgress: (f) => progress.push(f) });

    const check = unzipTest(outPath);
    expect(check.status, check.stderr).toBe(0);
    expect(check.stdout).toContain('No errors detected');

    const listing = zipListing(outPath);
    expect(listing).toEqual(result.entries);
    const stem = 'Dew on fern, frond 2';
    expect(listing).toEqual([
      `${stem}_001.raw`, `${stem}_001.jpg`,
      `${stem}_002.raw`, `${stem}_002.jpg`,
      `${stem}_003.raw`, `${stem}_003.jpg`,
      `${stem}_004.raw`,
      'contact-sheet.pdf', 'contact-sheet.jpg', 'plan.txt', 'manifest.csv', 'manifest.json',
    ]);
    // STORE mode: zipinfo's long listing names the method of every entry.
    const methods = execFileSync('/usr/bin/unzip', ['-Zl', outPath]).toString().split('\n').filter((l) => /^-/.test(l));
    expect(methods).toHaveLength(listing.length);
    for (const line of methods) expect(line).toMatch(/\bstor\b/);

    const dir = extract(outPath);
    const manifest = bundleManifestSchema.parse(JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')));
    expect(manifest.frames.map((f) => f.stackOrder)).toEqual([1, 2, 4, 5]);
    const originals = new Map(stack.frames.flatMap((f) => f.files.map((file) => [file.originalName, file] as const)));
    for (const frame of manifest.frames) {
      for (const file of frame.files) {
        const extracted = readFileSync(join(dir, file.newName));
        const original = originals.get(file.originalName)!;
        expect(sha256(extracted)).toBe(file.sha256);
        expect(sha256(readFileSync(original.path))).toBe(file.sha256);
        expect(extracted.length).toBe(file.bytes);
      }
    }
    expect(manifest.frames[1].flags).toEqual(['exposure-jump']);
    expect(manifest.legend.map((l) => l.code)).toContain('exposure-jump');
    expect(readFileSync(join(dir, 'plan.txt'), 'utf8')).toBe(stack.planText);
    expect(readFileSync(join(dir, 'contact-sheet.pdf'))).toEqual(readFileSync(stack.contactSheetPdfPath!));

    const csv = readFileSync(join(dir, 'manifest.csv'), 'utf8').trim().split('\r\n');
    expect(csv).toHaveLength(1 + 7);
    expect(csv[1]).toContain(`${stem}_001.raw`);

    expect(result.bytes).toBe(readFileSync(outPath).length);
    expect(progress.at(-1)).toBe(1);
    expect([...progress].sort((a, b) => a - b)).toEqual(progress);
  });

  it('numbers with four digits past 999 frames, RAW and JPEG keeping one number', async () => {
    const frames = Array.from({ length: 1001 }, (_, i) => ({
      order: i,
      files: [makeSource(1, `B_${i}.raw`, 'raw' as const)],
    }));
    frames[0].files.push(makeSource(1, 'B_0.jpg', 'jpeg'));
    const outPath = join(workDir, 'beetle.zip');
    await writeBundle({ outPath, stacks: [{ name: 'Museum beetle', frames }] });
    expect(unzipTest(outPath).status).toBe(0);
    const listing = zipListing(outPath);
    expect(listing.slice(0, 3)).toEqual(['Museum beetle_0001.raw', 'Museum beetle_0001.jpg', 'Museum beetle_0002.raw']);
    expect(listing).toContain('Museum beetle_1001.raw');
  });

  it('gives hostile stack names safe entries, one folder per stack in a session bundle', async () => {
    const hostile = ['../../etc/passwd', '/abs', 'C:\\temp\\x', 'beetle\u202Egpj.exe\u0007', 'Папоротник 羊歯', '/abs'];
    const stacks = hostile.map((name) => ({ name, frames: [{ order: 1, files: [makeSource(10, 'a.raw', 'raw' as const)] }] }));
    const outPath = join(workDir, 'session.zip');
    await writeBundle({ outPath, stacks });
    expect(unzipTest(outPath).status).toBe(0);
    const listing = zipListing(outPath);
    for (const entry of listing) {
      expect(entry.startsWith('/')).toBe(false);
      // eslint-disable-next-line no-control-regex -- looking for control characters
      expect(entry).not.toMatch(/\\|[\u0000-\u001F\u007F\u202E]/);
      expect(entry.split('/').every((segment) => segment !== '..' && segment !== '.' && segment !== '')).toBe(true);
      expect(entry.split('/')).toHaveLength(2);
    }
    const folders = [...new Set(listing.map((e) => e.split('/')[0]))];
    expect(folders).toHaveLength(hostile.length);
    expect(folders).toContain('Папоротник 羊歯');
    // unzip extracts everything inside the target folder and nowhere else.
    const dir = extract(outPath);
    expect(readdirSync(dir).sort()).toEqual([...folders].sort());
  });

  it('rejects a missing source with a clear error and leaves neither the bundle nor a .part file', async () => {
    const stack = fernStack();
    stack.frames[2].files[0].path = join(workDir, 'gone', 'FERN_0102.raw');
    const dir = mkdtempSync(join(workDir, 'missing-'));
    const outPath = join(dir, 'fern.zip');
    await expect(writeBundle({ outPath, stacks: [stack] })).rejects.toThrow(/"FERN_0102\.raw".*cannot be read.*ENOENT/s);
    expect(existsSync(outPath)).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('aborts mid-stream when a stored file no longer matches its SHA-256, leaving nothing behind', async () => {
    const stack = fernStack();
    writeFileSync(stack.frames[3].files[0].path, randomBytes(100));
    const dir = mkdtempSync(join(workDir, 'changed-'));
    const outPath = join(dir, 'fern.zip');
    await expect(writeBundle({ outPath, stacks: [stack] })).rejects.toThrow(/FERN_0105\.raw.*SHA-256/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('aborts when a source fails while being read, leaving nothing behind', async () => {
    const stack = fernStack();
    // Linux: /proc/self/mem stats as a regular file but reading offset 0 fails with EIO.
    stack.frames[0].files.push({ path: '/proc/self/mem', originalName: 'FERN_0104.xmp', ext: 'xmp', sha256: 'a'.repeat(64), role: 'other' });
    const dir = mkdtempSync(join(workDir, 'ioerror-'));
    await expect(writeBundle({ outPath: join(dir, 'fern.zip'), stacks: [stack] })).rejects.toThrow(/"FERN_0104\.xmp".*failed while reading.*EIO/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('refuses bad input with the field named', async () => {
    const stack = fernStack();
    stack.frames[0].files[0].sha256 = 'not-a-hash';
    await expect(writeBundle({ outPath: join(workDir, 'x.zip'), stacks: [stack] })).rejects.toThrow(/sha256/);
    await expect(writeBundle({ outPath: join(workDir, 'y.zip'), stacks: [] })).rejects.toThrow(/at least one stack/);
    await expect(writeBundle({ outPath: join(workDir, 'z.zip'), folder: false, stacks: [fernStack(), fernStack()] })).rejects.toThrow(/one folder per stack/);
  });
});

describe('bundle entry names', () => {
  it('keeps every stack name a single safe path segment', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (name) => {
        const safe = safeStackFolderName(name);
        expect(safe.length).toBeGreaterThan(0);
        // eslint-disable-next-line no-control-regex -- looking for control characters
        expect(safe).not.toMatch(/[/\\:*?"<>|\u0000-\u001F\u007F-\u009F\u202A-\u202E]/);
        expect(safe).not.toMatch(/\.\./);
        expect(safe.startsWith('.')).toBe(false);
        expect(new TextEncoder().encode(safe).length).toBeLessThanOrEqual(100);
        const entry = safeEntryName(`${name}.jpg`);
        // eslint-disable-next-line no-control-regex -- looking for control characters
        expect(entry).not.toMatch(/[/\\\u0000-\u001F]/);
        expect(new TextEncoder().encode(entry).length).toBeLessThanOrEqual(200);
      }),
      { numRuns: 500 },
    );
  });

  it('keeps letters of any script and a readable name', () => {
    expect(safeStackFolderName('Uhrwerk — Unruh, 5×')).toBe('Uhrwerk — Unruh, 5×');
    expect(safeStackFolderName('甲虫 標本')).toBe('甲虫 標本');
    expect(safeStackFolderName('../../etc/passwd')).toBe('etc_passwd');
    expect(safeStackFolderName('..')).toBe('stack');
    expect(safeStackFolderName('CON')).toBe('_CON');
    expect(frameEntryName('fern', 7, 3, '.RAW')).toBe('fern_007.raw');
  });
});
