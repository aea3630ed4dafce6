import { z } from 'zod';

export const STACK_STATES = ['draft', 'ready', 'handed-off', 'merged', 'archived'] as const;
export type StackState = (typeof STACK_STATES)[number];

const isoDate = z.iso.date('Use a date like 2026-05-14.');

export const sessionCreateSchema = z.object({
  title: z.string().trim().min(1, 'Give the session a title.').max(200),
  shootDate: isoDate,
  subject: z.string().trim().max(500).default(''),
  location: z.string().trim().max(500).default(''),
  notes: z.string().max(10_000).default(''),
});
export const sessionUpdateSchema = sessionCreateSchema.partial();

export const groupingOptionsSchema = z.object({
  gapFactor: z.number().min(1).max(50).optional(),
  minGapS: z.number().min(0).max(3600).optional(),
  maxGapS: z.number().min(1).max(86_400).optional(),
  minStackSize: z.number().int().min(2).max(100).optional(),
});

export const importCreateSchema = z.object({ expectedFiles: z.number().int().min(0).max(100_000).optional() });
export const hashCheckSchema = z.object({ sha256: z.array(z.string().regex(/^[0-9a-f]{64}$/)).max(10_000) });

export type SessionCreate = z.infer<typeof sessionCreateSchema>;
export type GroupingOptionsInput = z.infer<typeof groupingOptionsSchema>;

/** Per-frame statistics the worker stores for the stack checks (see worker/lib/frame-stats.ts). */
export interface FrameStatsJson {
  meanLuminance: number;
  sharpnessGrid: number[];
  gridCols: number;
  gridRows: number;
  widthPx: number;
  heightPx: number;
}
