import type { ObjectLiteral, Repository } from 'typeorm';
import type { z } from 'zod';
import { getDataSource } from '../lib/data-source';
import { NotFound } from '../lib/errors';
import { KitBody, KitExtensionSet, KitLens, KitRail } from '../entities/kit';
import { KIT_KIND_LABELS, type KitKind } from '../../shared/kit-presets';
import { KIT_SCHEMAS, type Kit, type KitItems } from '../../shared/schemas/kit';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

// What each kind stores besides id, studio and timestamps; the API shows exactly these.
const KINDS = {
  bodies: { entity: KitBody, fields: ['name', 'sensorFormat', 'sensorWidthMm', 'sensorHeightMm', 'pixelsAcross'] },
  lenses: { entity: KitLens, fields: ['name', 'focalLengthMm', 'widestFNumber', 'narrowestFNumber', 'maxMagnification', 'pupilMagnification'] },
  'extension-sets': { entity: KitExtensionSet, fields: ['name', 'tubeLengthsMm'] },
  rails: { entity: KitRail, fields: ['name', 'travelMm', 'smallestStepUm'] },
} as const satisfies Record<KitKind, { entity: unknown; fields: readonly string[] }>;

type Row = ObjectLiteral & { id: string; studioId: string; updatedAt: Date };

function repo(kind: KitKind): Repository<Row> {
  return getDataSource().getRepository(KINDS[kind].entity) as unknown as Repository<Row>;
}

function stored(kind: KitKind, row: Row): Record<string, unknown> {
  return Object.fromEntries(KINDS[kind].fields.map((f) => [f, row[f]]));
}

function view<K extends KitKind>(kind: K, row: Row): KitItems[K] {
  return { id: row.id, ...stored(kind, row), updatedAt: row.updatedAt.toISOString() } as KitItems[K];
}

async function findRow(studioId: string, kind: KitKind, id: string): Promise<Row> {
  const row = UUID.test(id) ? await repo(kind).findOneBy({ id, studioId }) : null;
  if (!row) throw new NotFound(`No such ${KIT_KIND_LABELS[kind].one} in this studio's kit.`);
  return row;
}

export async function listKitItems<K extends KitKind>(studioId: string, kind: K): Promise<KitItems[K][]> {
  const rows = await repo(kind).find({ where: { studioId }, order: { name: 'ASC', createdAt: 'ASC' } });
  return rows.map((r) => view(kind, r));
}

export async function listKit(studioId: string): Promise<Kit> {
  const [bodies, lenses, extensionSets, rails] = await Promise.all([
    listKitItems(studioId, 'bodies'),
    listKitItems(studioId, 'lenses'),
    listKitItems(studioId, 'extension-sets'),
    listKitItems(studioId, 'rails'),
  ]);
  return { bodies, lenses, extensionSets, rails };
}

/** The item, or null when it is not in this studio's kit (for plans that name kit by id). */
export async function findKitItem<K extends KitKind>(studioId: string, kind: K, id: string): Promise<KitItems[K] | null> {
  const row = UUID.test(id) ? await repo(kind).findOneBy({ id, studioId }) : null;
  return row ? view(kind, row) : null;
}

/** Validates the whole item (a ZodError becomes a 422 with field paths) and stores it. */
export async function createKitItem<K extends KitKind>(studioId: string, kind: K, input: unknown): Promise<KitItems[K]> {
  const values = (KIT_SCHEMAS[kind].input as z.ZodType).parse(input) as Record<string, unknown>;
  const r = repo(kind);
  const row = await r.save(r.create({ ...values, studioId }));
  return view(kind, row);
}

/** Applies a partial change: the stored item with the change must pass the full schema, else nothing is written. */
export async function updateKitItem<K extends KitKind>(studioId: string, kind: K, id: string, change: unknown): Promise<KitItems[K]> {
  const patch = (KIT_SCHEMAS[kind].patch as z.ZodType).parse(change) as Record<string, unknown>;
  return getDataSource().transaction(async (tx) => {
    const r = tx.getRepository(KINDS[kind].entity) as unknown as Repository<Row>;
    const row = UUID.test(id) ? await r.findOne({ where: { id, studioId }, lock: { mode: 'pessimistic_write' } }) : null;
    if (!row) throw new NotFound(`No such ${KIT_KIND_LABELS[kind].one} in this studio's kit.`);
    const defined = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
    const values = (KIT_SCHEMAS[kind].input as z.ZodType).parse({ ...stored(kind, row), ...defined }) as Record<string, unknown>;
    const saved = await r.save(r.merge(row, values));
    return view(kind, saved);
  });
}

/** Plans keep their own copy of the inputs, so deleting kit never changes a saved plan. */
export async function deleteKitItem(studioId: string, kind: KitKind, id: string): Promise<void> {
  const row = await findRow(studioId, kind, id);
  await repo(kind).delete({ id: row.id, studioId });
}
