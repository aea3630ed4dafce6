// Sessions with a card imported through the API, for tests of sorting and hand edits.
import { expect } from 'vitest';
import type { Agent } from './api';
import { BASE_TIME_MS, settings, taggedJpeg } from './card';
import type { CaptureSettings } from '../../scripts/lib/stack-renderer/capture-metadata';

export interface CardFileSpec {
  name: string;
  data: Buffer;
  mtimeMs?: number;
}

export interface FrameV {
  id: string;
  fileName: string;
  captureTimeMs: number | null;
  excluded: boolean;
  flags: string[];
  previewStatus: string;
  previewError: string | null;
  files: { id: string; name: string; kind: string }[];
}
export interface StackV {
  id: string;
  name: string;
  state: string;
  position: number;
  startReason: string;
  planId: string | null;
  version: number;
  frames: FrameV[];
}
export interface SortingV {
  stacks: StackV[];
  loose: FrameV[];
  undoLabel: string | null;
  groupingOptions: Record<string, number>;
}

export const sessionsBase = (studioId: string) => `/api/studios/${studioId}/sessions`;

export async function createSession(agent: Agent, studioId: string, title = 'Dew on fern') {
  const s = await agent.post(sessionsBase(studioId)).set('x-csrf-token', agent.csrf).send({ title, shootDate: '2026-05-14', subject: 'fern frond' });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  return s.body.id as string;
}

export async function createImport(agent: Agent, studioId: string, sessionId: string) {
  const imp = await agent.post(`${sessionsBase(studioId)}/${sessionId}/imports`).set('x-csrf-token', agent.csrf).send({});
  expect(imp.status).toBe(201);
  return imp.body.id as string;
}

export function uploadFiles(agent: Agent, studioId: string, sessionId: string, importId: string, files: CardFileSpec[]) {
  const req = agent.post(`${sessionsBase(studioId)}/${sessionId}/imports/${importId}/files`).set('x-csrf-token', agent.csrf);
  for (const f of files) {
    req.field('lastModified', String(f.mtimeMs ?? ''));
    req.attach('files', f.data, { filename: f.name, contentType: 'application/octet-stream' });
  }
  return req;
}

/** Bursts of JPEG frames: each burst `count` frames `stepS` apart, bursts `pauseS` apart. */
export async function shootBursts(bursts: { count: number; stepS: number; over?: Partial<CaptureSettings> }[], pauseS = 300, prefix = 'FRN') {
  const files: CardFileSpec[] = [];
  let t = BASE_TIME_MS;
  let n = 1;
  for (const b of bursts) {
    for (let i = 0; i < b.count; i++) {
      files.push({ name: `${prefix}_${String(n).padStart(4, '0')}.JPG`, data: await taggedJpeg(settings(t, b.over), 60 + ((n * 17) % 150)) });
      n += 1;
      t += b.stepS * 1000;
    }
    t += pauseS * 1000;
  }
  return files;
}

/** A session holding these files, imported and grouped; answers its sorting view. */
export async function sessionWithCard(agent: Agent, studioId: string, files: CardFileSpec[]): Promise<{ sessionId: string; sorting: SortingV }> {
  const sessionId = await createSession(agent, studioId);
  const importId = await createImport(agent, studioId, sessionId);
  expect((await uploadFiles(agent, studioId, sessionId, importId, files)).status).toBe(201);
  await agent.post(`${sessionsBase(studioId)}/${sessionId}/imports/${importId}/complete`).set('x-csrf-token', agent.csrf).send({}).expect(200);
  const sorting = await agent.get(`${sessionsBase(studioId)}/${sessionId}/sorting`).expect(200);
  return { sessionId, sorting: sorting.body as SortingV };
}
