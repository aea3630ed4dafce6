/**
 * Renders a synthetic focus stack (or a whole card) into a folder.
 *
 *   npx tsx scripts/render-stack.ts --out DIR [--frames N] [--seed S] [--scene drop-on-leaf|beetle]
 *     [--width PX] [--height PX] [--raw] [--start ISO] [--f-number N] [--body-serial TEXT]
 *     [--first-number N] [--exposure-jump-at K] [--exposure-stops X] [--exposure-jump-persists]
 *     [--skip-step-at K] [--repeat-at K] [--card] [--force]
 *
 * Frame indexes (K) count from 0. --card renders a memory card (several stacks with test shots)
 * and uses only --seed, --width, --height and --body-serial. Existing files are never
 * overwritten unless --force is given.
 */
import fs from 'node:fs/promises';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { renderCard, renderStack, type RenderStackOptions } from './lib/stack-renderer';

export interface RenderStackCommand {
  outDir: string;
  force: boolean;
  card: boolean;
  options: RenderStackOptions;
}

function integer(name: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  if (!/^-?\d+$/.test(text)) throw new RangeError(`--${name} must be a whole number, got "${text}"`);
  return Number(text);
}

function decimal(name: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (text.trim() === '' || !Number.isFinite(value)) throw new RangeError(`--${name} must be a number, got "${text}"`);
  return value;
}

/** Reads the command line; throws a RangeError with a sentence a person can act on. */
export function parseRenderStackArgs(argv: string[]): RenderStackCommand {
  let values;
  try {
    ({ values } = parseArgs({
      args: argv,
      strict: true,
      options: {
        out: { type: 'string' },
        frames: { type: 'string' },
        seed: { type: 'string' },
        scene: { type: 'string' },
        width: { type: 'string' },
        height: { type: 'string' },
        raw: { type: 'boolean' },
        start: { type: 'string' },
        'f-number': { type: 'string' },
        'body-serial': { type: 'string' },
        'first-number': { type: 'string' },
        'exposure-jump-at': { type: 'string' },
        'exposure-stops': { type: 'string' },
        'exposure-jump-persists': { type: 'boolean' },
        'skip-step-at': { type: 'string' },
        'repeat-at': { type: 'string' },
        card: { type: 'boolean' },
        force: { type: 'boolean' },
      },
    }));
  } catch (error) {
    throw new RangeError(error instanceof Error ? error.message : String(error), { cause: error });
  }
  if (!values.out) throw new RangeError('--out DIR is required: the folder to write the frames into');
  const options: RenderStackOptions = {
    seed: integer('seed', values.seed),
    frameCount: integer('frames', values.frames),
    scene: values.scene as RenderStackOptions['scene'],
    widthPx: integer('width', values.width),
    heightPx: integer('height', values.height),
    withRaw: values.raw,
    startTime: values.start,
    fNumber: decimal('f-number', values['f-number']),
    bodySerial: values['body-serial'],
    firstFileNumber: integer('first-number', values['first-number']),
    faults: {
      exposureJumpAt: integer('exposure-jump-at', values['exposure-jump-at']),
      exposureStops: decimal('exposure-stops', values['exposure-stops']),
      exposureJumpPersists: values['exposure-jump-persists'],
      skipStepAt: integer('skip-step-at', values['skip-step-at']),
      repeatAt: integer('repeat-at', values['repeat-at']),
    },
  };
  const withoutUnset = <T extends object>(object: T) =>
    Object.fromEntries(Object.entries(object).filter(([, value]) => value !== undefined)) as T;
  options.faults = withoutUnset(options.faults ?? {});
  return { outDir: values.out, force: values.force ?? false, card: values.card ?? false, options: withoutUnset(options) };
}

/** Writes the files and truth.json; refuses (before writing anything) to replace files unless forced. */
export async function writeRendered(outDir: string, files: { name: string; buffer: Buffer }[], truth: unknown, force: boolean): Promise<string[]> {
  await fs.mkdir(outDir, { recursive: true });
  const names = [...files.map((file) => file.name), 'truth.json'];
  if (!force) {
    const existing = new Set(await fs.readdir(outDir));
    const clashes = names.filter((name) => existing.has(name));
    if (clashes.length > 0) {
      const shown = clashes.slice(0, 3).join(', ') + (clashes.length > 3 ? ` and ${clashes.length - 3} more` : '');
      throw new RangeError(`${outDir} already holds ${shown}; nothing was written. Choose another --out folder or add --force.`);
    }
  }
  for (const file of files) await fs.writeFile(path.join(outDir, file.name), file.buffer);
  await fs.writeFile(path.join(outDir, 'truth.json'), `${JSON.stringify(truth, null, 2)}\n`);
  return names;
}

export async function main(argv: string[]): Promise<number> {
  try {
    const command = parseRenderStackArgs(argv);
    const { options } = command;
    const rendered = command.card
      ? await renderCard({ seed: options.seed, widthPx: options.widthPx, heightPx: options.heightPx, bodySerial: options.bodySerial })
      : await renderStack(options);
    const written = await writeRendered(command.outDir, rendered.files, rendered.truth, command.force);
    console.log(`Wrote ${written.length} files to ${command.outDir}`);
    return 0;
  } catch (error) {
    console.error(error instanceof Error ? error.message : String(error));
    return 2;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  process.exitCode = await main(process.argv.slice(2));
}
