import { useId } from 'react';
import type { FocusMap as FocusMapData } from '@shared/schemas/check-views';
import { frameColour, textOn } from '../lib/palette';
import { GlyphPaths } from './check-glyph';

const CELL_W = 48;
const CELL_H = 32;

interface Props {
  map: FocusMapData;
  /** number of frames checked, for the palette's range */
  frameCount: number;
  /** the last frame number, for the legend */
  lastNumber: number;
  /** cells (row-major) in a focus gap, with the frames around the gap */
  gapCells: Map<number, string>;
}

/** Which frame is sharpest across the picture, 8 x 6 cells, with the cells of any focus gap marked. */
export function FocusMap({ map, frameCount, lastNumber, gapCells }: Props) {
  const id = useId();
  const { gridCols, gridRows, sharpestFrameNumbers } = map;
  const width = gridCols * CELL_W;
  const height = gridRows * CELL_H;
  const colourOf = (n: number) => frameColour(n, lastNumber);
  const rows = Array.from({ length: gridRows }, (_, r) => sharpestFrameNumbers.slice(r * gridCols, (r + 1) * gridCols));
  return (
    <figure className="min-w-0">
      <figcaption id={`${id}-cap`} className="mb-1 text-sm text-slate">
        Focus map: each cell of the picture is coloured by the frame in which it is sharpest (pale for near frames, dark for far ones; the
        number is written in the cell). Cells where a focus gap leaves detail soft carry the plum bracket glyph; grey cells hold no detail.
      </figcaption>
      <svg viewBox={`0 0 ${width} ${height}`} className="w-full max-w-md rounded border border-rule" role="img" aria-labelledby={`${id}-cap`}>
        <defs>
          <pattern id={`${id}-none`} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="6" height="6" fill="#ECE8DF" />
            <line x1="0" y1="0" x2="0" y2="6" stroke="#D9D4CA" strokeWidth="2" />
          </pattern>
        </defs>
        {sharpestFrameNumbers.map((n, cell) => {
          const x = (cell % gridCols) * CELL_W;
          const y = Math.floor(cell / gridCols) * CELL_H;
          const fill = n === null ? `url(#${id}-none)` : colourOf(n);
          return (
            <g key={cell}>
              <rect x={x} y={y} width={CELL_W} height={CELL_H} fill={fill} stroke="#FFFEFB" strokeWidth={1} />
              {n === null ? null : (
                <text x={x + CELL_W / 2} y={y + CELL_H / 2 + 4} textAnchor="middle" fontSize="11" fill={textOn(colourOf(n))} className="num">{n}</text>
              )}
              {gapCells.has(cell) ? (
                <g transform={`translate(${x + CELL_W - 15} ${y + 1})`}>
                  <rect width={14} height={14} rx={2} fill="#FFFEFB" />
                  <g transform="translate(1 1) scale(0.75)"><GlyphPaths code="focus-gap" /></g>
                </g>
              ) : null}
            </g>
          );
        })}
      </svg>
      <Legend lastNumber={lastNumber} frameCount={frameCount} />
      <details className="mt-1 text-sm">
        <summary className="cursor-pointer text-moss">Focus map as a table</summary>
        <table className="mt-1 text-sm" aria-label="Sharpest frame in each cell, top row first">
          <tbody>
            {rows.map((row, r) => (
              <tr key={r}>
                <th scope="row" className="pr-2 text-left font-normal text-slate">row {r + 1}</th>
                {row.map((n, c) => {
                  const gap = gapCells.get(r * gridCols + c);
                  return <td key={c} className="num px-1 text-right">{n === null ? '—' : n}{gap ? ` (gap ${gap})` : ''}</td>;
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}

function Legend({ lastNumber, frameCount }: { lastNumber: number; frameCount: number }) {
  const steps = Array.from({ length: 24 }, (_, i) => frameColour(1 + (i / 23) * (lastNumber - 1), lastNumber));
  return (
    <div className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-slate">
      <span className="flex items-center gap-1">
        <span className="num">frame 1</span>
        <span aria-hidden="true" className="inline-flex h-3 w-32 overflow-hidden rounded-sm border border-rule">
          {steps.map((c, i) => <span key={i} className="h-full flex-1" style={{ background: c }} />)}
        </span>
        <span className="num">frame {lastNumber}</span>
        <span>({frameCount} checked)</span>
      </span>
      <span className="flex items-center gap-1">
        <svg viewBox="0 0 16 16" width={13} height={13} aria-hidden="true"><GlyphPaths code="focus-gap" /></svg>
        focus gap
      </span>
      <span className="flex items-center gap-1">
        <span aria-hidden="true" className="inline-block h-3 w-4 rounded-sm border border-rule bg-[#ECE8DF]" />
        no detail
      </span>
    </div>
  );
}
