// Stacks ready for hand-off, made through the API, and readers for what comes back (mail, zips).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'vitest';
import type { Agent } from './api';
import { caughtMailTo } from './fixtures';
import { sessionsBase, sessionWithCard, shootBursts } from './sessions';
import { until } from './worker';

/** A session with one stack of `count` frames, marked ready by a person. */
export async function readyStack(agent: Agent, studioId: string, prefix = 'FRN', count = 5) {
  const { sessionId, sorting } = await sessionWithCard(agent, studioId, await shootBursts([{ count, stepS: 4 }], 300, prefix));
  expect(sorting.stacks).toHaveLength(1);
  const stack = sorting.stacks[0];
  const res = await agent.post(`${sessionsBase(studioId)}/${sessionId}/stacks/${stack.id}/state`).set('x-csrf-token', agent.csrf).send({ state: 'ready' });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return { sessionId, stackId: stack.id, frameNames: stack.frames.map((f) => f.fileName) };
}

/** supertest parser that keeps a binary body as one Buffer. */
export function binaryParser(res: unknown, cb: (err: Error | null, body: Buffer) => void) {
  // superagent hands the parser the raw response stream (its typings call it a response).
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
}

/** The newest caught message to `email` whose subject starts with `subjectStart` and whose text holds `about`. */
export function mailTo(email: string, subjectStart: string, about: string) {
  return until(`mail "${subjectStart}" about ${about} to ${email}`, async () =>
    (await caughtMailTo(email)).find((m) => m.subject.startsWith(subjectStart) && m.text.includes(about)), 20_000);
}

/** Debian's unzip checks the archive (`unzip -t`) and hands back manifest.json. */
export function checkZip(zip: Buffer): { testOutput: string; manifest: { frames: { number: number; files: { originalName: string; newName: string }[] }[] } } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-handoff-zip-'));
  try {
    const file = path.join(dir, 'bundle.zip');
    fs.writeFileSync(file, zip);
    const testOutput = execFileSync('/usr/bin/unzip', ['-t', file], { encoding: 'utf8' });
    const manifest = JSON.parse(execFileSync('/usr/bin/unzip', ['-p', file, 'manifest.json'], { encoding: 'utf8' }));
    return { testOutput, manifest };
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** ImageMagick's own reading of a picture's size (the reference for the merged result's size). */
export function identifySize(picture: Buffer): { widthPx: number; heightPx: number } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-identify-'));
  try {
    const file = path.join(dir, 'picture');
    fs.writeFileSync(file, picture);
    const [w, h] = execFileSync('/usr/bin/identify', ['-format', '%w %h', `${file}[0]`], { encoding: 'utf8' }).trim().split(' ').map(Number);
    return { widthPx: w, heightPx: h };
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
