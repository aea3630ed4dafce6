import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ZipArchive } from 'archiver';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SNIFF_BYTES, sniffImageKind, type SniffResult } from '../../server/lib/sniff';
import { readWithExiftool } from '../helpers/exiftool';

// Accepted kinds are checked against Debian's exiftool reading the same bytes; hand-built files
// follow the published layouts named beside them.

const picture = (widthPx = 96, heightPx = 64) =>
  sharp({ create: { width: widthPx, height: heightPx, channels: 3, background: '#8a5a2b' } });

type IfdEntry = [tag: number, type: 3 | 4 | 1, value: number];

/** A minimal TIFF (TIFF 6.0 §2): 8-byte header, IFD0 at offset 8, entries of 12 bytes. */
function tiffBytes(header: number[], entries: IfdEntry[], littleEndian = true): Uint8Array {
  const bytes = new Uint8Array(8 + 2 + entries.length * 12 + 4 + 64);
  const view = new DataView(bytes.buffer);
  bytes.set(header, 0);
  view.setUint32(4, 8, littleEndian);
  view.setUint16(8, entries.length, littleEndian);
  [...entries].sort((a, b) => a[0] - b[0]).forEach(([tag, type, value], i) => {
    const at = 10 + i * 12;
    view.setUint16(at, tag, littleEndian);
    view.setUint16(at + 2, type, littleEndian);
    view.setUint32(at + 4, type === 1 ? 4 : 1, littleEndian);
    if (type === 3) view.setUint16(at + 8, value, littleEndian);
    else view.setUint32(at + 8, value, type === 1 ? false : littleEndian);
  });
  return bytes;
}

/** An ISO/IEC 14496-12 `ftyp` box: size, 'ftyp', major brand, minor version, compatible brands. */
function ftypBox(major: string, compatible: string[]): Uint8Array {
  const text = `ftyp${major}\0\0\0\0${compatible.join('')}`;
  const bytes = new Uint8Array(4 + text.length);
  new DataView(bytes.buffer).setUint32(0, bytes.length);
  for (let i = 0; i < text.length; i += 1) bytes[4 + i] = text.charCodeAt(i);
  return bytes;
}

const II = [0x49, 0x49, 0x2a, 0x00];
const MM = [0x4d, 0x4d, 0x00, 0x2a];
const SIZE: IfdEntry[] = [[256, 3, 16], [257, 3, 16]];
const CFA: IfdEntry = [262, 3, 32803]; // TIFF/EP PhotometricInterpretation: colour filter array

let dir: string;
// A neutral extension, so exiftool too decides by content alone.
const fileOf = (name: string) => join(dir, `${name}.bin`);
const samples = new Map<string, Uint8Array>();

async function zipBytes(): Promise<Uint8Array> {
  const zip = new ZipArchive({ store: true });
  const chunks: Buffer[] = [];
  zip.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise((resolve) => zip.on('end', resolve));
  zip.append('fern stack, 42 frames', { name: 'notes.txt' });
  await zip.finalize();
  await done;
  return Buffer.concat(chunks);
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lamella-sniff-'));
  const jpeg = await picture().jpeg().toBuffer();
  samples.set('jpeg', jpeg);
  samples.set('png', await picture().png().toBuffer());
  samples.set('small-tiff', await picture().tiff({ compression: 'lzw' }).toBuffer());
  // Uncompressed 400×300 RGB: libtiff writes IFD0 after the 360 kB of pixels.
  samples.set('large-tiff', await picture(400, 300).tiff({ compression: 'none' }).toBuffer());
  samples.set('avif', await picture().avif().toBuffer());
  samples.set('cfa-tiff', tiffBytes(II, [...SIZE, CFA]));
  samples.set('cfa-tiff-big-endian', tiffBytes(MM, [...SIZE, CFA], false));
  samples.set('preview-and-subifd', tiffBytes(II, [...SIZE, [254, 4, 1], [330, 4, 200], [262, 3, 2]]));
  samples.set('dng', tiffBytes(II, [...SIZE, CFA, [50706, 1, 0x01040000]])); // DNGVersion 1.4.0.0
  samples.set('iiro', tiffBytes([0x49, 0x49, 0x52, 0x4f], [...SIZE, CFA]));
  samples.set('iiu', tiffBytes([0x49, 0x49, 0x55, 0x00], SIZE));
  samples.set('heic', ftypBox('heic', ['mif1', 'heic']));
  samples.set('mif1', ftypBox('mif1', ['mif1', 'heic']));
  samples.set('crx', ftypBox('crx ', ['crx ', 'isom']));
  samples.set('truncated', jpeg.subarray(0, 100));
  for (const [name, bytes] of samples) await writeFile(fileOf(name), bytes);
}, 30_000);

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('accepted kinds, by content alone', () => {
  it.each([
    // [sample, expected kind, isRaw, exiftool FileType]
    ['jpeg', 'jpeg', false, 'JPEG'],
    ['png', 'png', false, 'PNG'],
    ['small-tiff', 'tiff-raw', false, 'TIFF'],
    ['large-tiff', 'tiff-raw', false, 'TIFF'],
    ['cfa-tiff', 'tiff-raw', true, 'TIFF'],
    ['cfa-tiff-big-endian', 'tiff-raw', true, 'TIFF'],
    ['preview-and-subifd', 'tiff-raw', true, 'TIFF'],
    ['dng', 'dng', true, 'DNG'],
    ['avif', 'heif', false, 'AVIF'],
    ['heic', 'heif', false, 'HEIC'],
    ['mif1', 'heif', false, 'HEIF'],
  ] as const)('%s is %s', async (name, kind, isRaw, exiftoolType) => {
    const result = await sniffImageKind((samples.get(name) as Uint8Array).subarray(0, SNIFF_BYTES));
    expect(result).toMatchObject({ ok: true, kind, isRaw });
    const [reference] = await readWithExiftool([fileOf(name)]);
    expect(reference['File:FileType']).toBe(exiftoolType);
  });

  it.each(['iiro', 'iiu'])('%s: a TIFF-structured raw variant with its own magic', async (name) => {
    expect(await sniffImageKind(samples.get(name) as Uint8Array)).toMatchObject({ ok: true, kind: 'tiff-raw', isRaw: true });
    const [reference] = await readWithExiftool([fileOf(name)]);
    // exiftool recognises a raw format of its own, not a plain TIFF.
    expect(reference['File:FileType']).toBeTypeOf('string');
    expect(reference['File:FileType']).not.toBe('TIFF');
  });

  it('an ISO-BMFF file with the raw brand "crx " is bmff-raw', async () => {
    expect(await sniffImageKind(samples.get('crx') as Uint8Array)).toMatchObject({ ok: true, kind: 'bmff-raw', isRaw: true });
    const [reference] = await readWithExiftool([fileOf('crx')]);
    expect(reference['QuickTime:MajorBrand']).toBe('crx ');
  });

  it('a JPEG cut after 100 bytes is still a JPEG by its magic (reading its metadata flags it)', async () => {
    expect(await sniffImageKind(samples.get('truncated') as Uint8Array)).toMatchObject({ ok: true, kind: 'jpeg' });
  });

  it('looks only at the first SNIFF_BYTES', async () => {
    const jpeg = samples.get('jpeg') as Uint8Array;
    const padded = new Uint8Array(SNIFF_BYTES * 3);
    padded.set(jpeg.subarray(0, Math.min(jpeg.length, SNIFF_BYTES)));
    padded.fill(0x41, SNIFF_BYTES); // text after the window has no say
    expect(await sniffImageKind(padded)).toMatchObject({ ok: true, kind: 'jpeg' });
  });
});

describe('refused content, with a reason a person can read', () => {
  const elf = new Uint8Array(64);
  elf.set([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]); // System V ABI: e_ident "\x7fELF", 64-bit, little-endian
  elf.set([2, 0, 0x3e, 0], 16); // e_type executable, e_machine x86-64
  const pe = new Uint8Array(256);
  pe.set([0x4d, 0x5a]); // "MZ": the DOS header every Windows executable starts with
  const encoder = new TextEncoder();
  /** Ends the sample inside a multi-byte character, as a fixed-size read of a text file would. */
  const cutMidCharacter = (bytes: Uint8Array) => {
    let end = SNIFF_BYTES;
    while ((bytes[end] & 0xc0) !== 0x80) end -= 1; // stop just before a continuation byte
    expect(() => new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(0, end))).toThrow();
    return bytes.subarray(0, end);
  };

  it.each([
    ['zero bytes', async () => new Uint8Array(0), 'empty', 'empty file'],
    ['a text file named .jpg', async () => encoder.encode('fern stack 1: 42 frames at f/5.6\nbeetle: 80 frames\n'), 'text', 'not an image Lamella accepts: looks like text'],
    ['text with accents cut mid-character', async () => cutMidCharacter(encoder.encode('Käfer, Farn, Uhrwerk — '.repeat(300))), 'text', 'not an image Lamella accepts: looks like text'],
    ['an ELF executable', async () => elf, 'executable', 'not an image Lamella accepts: looks like an executable program'],
    ['a Windows executable', async () => pe, 'executable', 'not an image Lamella accepts: looks like an executable program'],
    ['a shell script', async () => encoder.encode('#!/bin/sh\necho fern\n'), 'executable', 'not an image Lamella accepts: looks like an executable script'],
    ['a zip archive', zipBytes, 'archive', 'not an image Lamella accepts: looks like an archive (zip)'],
    ['a GIF', async () => picture().gif().toBuffer(), 'other-format', /^not an image Lamella accepts: looks like gif \(image\/gif\)/],
    ['an MP4 video', async () => ftypBox('isom', ['isom', 'mp41']), 'other-format', /^not an image Lamella accepts: looks like mp4/],
    ['random bytes', async () => Uint8Array.from({ length: 512 }, (_, i) => (i * 131 + 7) % 251 || 1), 'unrecognised', 'not an image Lamella accepts: unrecognised content'],
    ['a bare TIFF header', async () => new Uint8Array(II), 'unrecognised', 'not an image Lamella accepts: unrecognised content'],
  ] as [string, () => Promise<Uint8Array>, string, string | RegExp][])('%s', async (_name, make, code, reason) => {
    const result: SniffResult = await sniffImageKind(await make());
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.code).toBe(code);
    if (typeof reason === 'string') expect(result.reason).toBe(reason);
    else expect(result.reason).toMatch(reason);
  });
});
