import type { z } from 'zod';

/** Parses request input; a ZodError becomes a 422 with field paths in the error handler. */
export function parse<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  return schema.parse(value);
}
