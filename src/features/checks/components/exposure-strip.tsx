import { CartesianGrid, ComposedChart, Line, ReferenceLine, Tooltip, XAxis, YAxis, type DotItemDotProps } from 'recharts';
import type { CheckedFrame } from '@shared/schemas/check-views';
import { CHECK_GLYPHS } from '@shared/check-glyphs';
import { GlyphPaths } from './check-glyph';

const COLORS = { line: '#2F6F5E', rule: '#D9D4CA', slate: '#5B6B73', card: '#FFFEFB' };
const stopsText = (stops: number) => `${stops >= 0 ? '+' : '−'}${Math.abs(stops).toFixed(2)} stops`;

interface Props {
  frames: CheckedFrame[];
  /** frame numbers an exposure-jump check names */
  jumpNumbers: Set<number>;
  limitStops: number;
}

/** Each checked frame's exposure against the stack's median, in stops; jumps carry their glyph. */
export function ExposureStrip({ frames, jumpNumbers, limitStops }: Props) {
  const data = frames.map((f) => ({ number: f.number, stops: f.stops === null ? null : Number(f.stops.toFixed(3)) }));
  const measured = frames.filter((f) => f.stops !== null);
  const reach = Math.max(1, ...measured.map((f) => Math.ceil(Math.abs(f.stops as number) * 2) / 2));
  const dot = (props: DotItemDotProps) => {
    const { cx, cy, payload, index } = props;
    if (cx === undefined || cy === undefined || payload.stops === null) return <g key={`dot-${index}`} />;
    if (!jumpNumbers.has(payload.number)) return <circle key={`dot-${index}`} cx={cx} cy={cy} r={2.5} fill={COLORS.line} />;
    // the exposure-jump glyph, on a small card so it reads over the line
    return (
      <g key={`dot-${index}`} transform={`translate(${Number(cx) - 9} ${Number(cy) - 9})`}>
        <rect width={18} height={18} rx={3} fill={COLORS.card} stroke={COLORS.rule} />
        <g transform="translate(1 1)"><GlyphPaths code="exposure-jump" /></g>
      </g>
    );
  };
  return (
    <figure className="min-w-0">
      <figcaption className="mb-1 text-sm text-slate">
        Exposure of each frame against the stack’s median, in stops. A frame more than {limitStops.toFixed(2)} stops off its neighbours is an
        exposure jump, marked with the {CHECK_GLYPHS['exposure-jump'].label.toLowerCase()} glyph (a half-filled circle).
      </figcaption>
      <ComposedChart responsive style={{ width: '100%', height: 180 }} data={data} margin={{ top: 12, right: 12, bottom: 4, left: 0 }} accessibilityLayer={false}>
        <CartesianGrid stroke={COLORS.rule} strokeDasharray="2 4" />
        <XAxis dataKey="number" tick={{ fontSize: 11, fill: COLORS.slate }} label={{ value: 'frame', position: 'insideBottomRight', offset: -2, fontSize: 11, fill: COLORS.slate }} />
        <YAxis domain={[-reach, reach]} tick={{ fontSize: 11, fill: COLORS.slate }} width={40} label={{ value: 'stops', angle: -90, position: 'insideLeft', fontSize: 11, fill: COLORS.slate }} />
        <ReferenceLine y={0} stroke={COLORS.slate} strokeDasharray="4 3" />
        <Tooltip formatter={(v) => stopsText(Number(v))} labelFormatter={(n) => `Frame ${n}`} />
        <Line dataKey="stops" name="Exposure" stroke={COLORS.line} strokeWidth={1.5} dot={dot} activeDot={{ r: 4 }} connectNulls isAnimationActive={false} />
      </ComposedChart>
      <details className="mt-1 text-sm">
        <summary className="cursor-pointer text-moss">Exposure per frame as a table</summary>
        <table className="mt-1 text-sm" aria-label="Exposure per frame">
          <thead>
            <tr className="border-b border-rule text-left text-slate">
              <th scope="col" className="pr-4 font-medium">Frame</th>
              <th scope="col" className="pr-4 text-right font-medium">Against the median</th>
              <th scope="col" className="font-medium">Check</th>
            </tr>
          </thead>
          <tbody>
            {frames.map((f) => (
              <tr key={f.frameId} className="border-b border-rule/60">
                <th scope="row" className="num pr-4 text-left font-normal">{f.number}</th>
                <td className="num pr-4 text-right">{f.stops === null ? 'not measured' : stopsText(f.stops)}</td>
                <td>{jumpNumbers.has(f.number) ? 'exposure jump' : ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
