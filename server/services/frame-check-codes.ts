// The check marks each frame of a stack carries on its contact sheet, in the manifest and on the
// stack page. Today they come from the frames' own flags; the stack checks (stack_checks) add
// theirs here, so every place that draws marks draws the same ones.
import type { EntityManager } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { storedCheckCodesByFrame } from './check-results-service';

// Flags that are about the preview, not the frame: the grey cell already says so.
const NOT_CHECK_FLAGS = new Set(['no-preview', 'too-large']);
// Flags raised while grouping that name a check.
const FLAG_TO_CHECK: Record<string, string> = { 'exposure-change': 'exposure-jump' };

/** Frame flags as check codes (known checks get their glyph; other flags a plain ring). */
export function checkCodesFromFlags(flags: string[]): string[] {
  return [...new Set(flags.filter((f) => !NOT_CHECK_FLAGS.has(f)).map((f) => FLAG_TO_CHECK[f] ?? f))];
}

/**
 * frameId → check codes, for every frame of the stack (frames without marks map to []): the
 * frame's own flags, then the codes of the stack checks of its current arrangement.
 */
export async function checkCodesByFrame(stackId: string, manager: EntityManager = getDataSource().manager): Promise<Map<string, string[]>> {
  const rows: { id: string; flags: string[] }[] = await manager.query(`SELECT id, flags FROM frames WHERE stack_id = $1`, [stackId]);
  const checked = await storedCheckCodesByFrame(stackId, manager);
  return new Map(rows.map((r) => [r.id, [...new Set([...checkCodesFromFlags(r.flags), ...(checked.get(r.id) ?? [])])]]));
}
