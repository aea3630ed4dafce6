import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import { SOFT_AIRY_PIXELS } from '@shared/optics';
import type { ApertureSweep } from '@shared/schemas/plan-input';
import { count, duration, fNumber, length, sig } from '@/lib/units';

const COLORS = { frames: '#2F6F5E', airy: '#4A6FA5', limit: '#A4452C', recommended: '#B7791F', rule: '#D9D4CA', slate: '#5B6B73' };

/** Frames and Airy disk (px) against f-number, the recommended aperture and the 2.5 px limit marked. */
export function SweepChart({ sweep }: { sweep: ApertureSweep }) {
  const data = sweep.rows.map((r) => ({ label: fNumber(r.fNumber), frames: r.frames, airyPx: Number(r.airyDiskPx.toFixed(2)) }));
  const recommended = fNumber(sweep.recommendedFNumber);
  return (
    <figure className="min-w-0">
      <figcaption className="mb-2 text-sm text-slate">
        Frames (left axis) and Airy disk in pixels (right axis) at each aperture; recommended {recommended}, diffraction limit at {SOFT_AIRY_PIXELS} px.
      </figcaption>
      <ComposedChart responsive style={{ width: '100%', height: 260 }} data={data} margin={{ top: 16, right: 8, bottom: 4, left: 0 }} accessibilityLayer={false}>
        <CartesianGrid stroke={COLORS.rule} strokeDasharray="2 4" />
        <XAxis dataKey="label" tick={{ fontSize: 11, fill: COLORS.slate }} interval="preserveStartEnd" />
        <YAxis yAxisId="frames" tick={{ fontSize: 11, fill: COLORS.slate }} width={44} allowDecimals={false} label={{ value: 'frames', angle: -90, position: 'insideLeft', fontSize: 11, fill: COLORS.slate }} />
        <YAxis yAxisId="px" orientation="right" tick={{ fontSize: 11, fill: COLORS.slate }} width={36} label={{ value: 'px', angle: 90, position: 'insideRight', fontSize: 11, fill: COLORS.slate }} />
        <Tooltip formatter={(v, name) => (name === 'Airy disk' ? `${v} px` : `${v} frames`)} />
        <Legend wrapperStyle={{ fontSize: 12 }} />
        <ReferenceLine yAxisId="px" y={SOFT_AIRY_PIXELS} stroke={COLORS.limit} strokeDasharray="5 3" label={{ value: `${SOFT_AIRY_PIXELS} px limit`, position: 'insideTopRight', fontSize: 11, fill: COLORS.limit }} />
        <ReferenceLine yAxisId="frames" x={recommended} stroke={COLORS.recommended} strokeWidth={2} label={{ value: 'recommended', position: 'top', fontSize: 11, fill: COLORS.recommended }} />
        <Line yAxisId="frames" dataKey="frames" name="Frames" stroke={COLORS.frames} strokeWidth={2} dot={{ r: 2 }} isAnimationActive={false} />
        <Line yAxisId="px" dataKey="airyPx" name="Airy disk" stroke={COLORS.airy} strokeWidth={2} strokeDasharray="6 2" dot={{ r: 2 }} isAnimationActive={false} />
      </ComposedChart>
    </figure>
  );
}

/** The same sweep as a table, for reading exact figures. */
export function SweepTable({ sweep }: { sweep: ApertureSweep }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm" aria-label="Aperture sweep">
        <thead>
          <tr className="border-b border-rule text-left text-slate">
            <th scope="col" className="py-1 pr-3 font-medium">Aperture</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">Frames</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">Step</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">Airy disk</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">Light loss</th>
            <th scope="col" className="py-1 text-right font-medium">Shoot time</th>
          </tr>
        </thead>
        <tbody>
          {sweep.rows.map((r) => {
            const best = r.fNumber === sweep.recommendedFNumber;
            return (
              <tr key={r.fNumber} className={`border-b border-rule/60 ${best ? 'bg-moss/10 font-medium' : ''}`} aria-current={best ? 'true' : undefined}>
                <th scope="row" className="py-1 pr-3 text-left font-normal whitespace-nowrap">
                  {fNumber(r.fNumber)}
                  {best ? <span className="ml-1 text-xs text-moss">recommended</span> : null}
                </th>
                <td className="num py-1 pr-3 text-right">{count(r.frames)}</td>
                <td className="num py-1 pr-3 text-right whitespace-nowrap">{r.stepMm === null ? '—' : length(r.stepMm)}</td>
                <td className={`num py-1 pr-3 text-right whitespace-nowrap ${r.diffractionSoft ? 'text-clay' : ''}`}>
                  {sig(r.airyDiskPx)} px{r.diffractionSoft ? <span className="ml-1 text-xs">soft</span> : null}
                </td>
                <td className="num py-1 pr-3 text-right whitespace-nowrap">{sig(r.lightLossStops)} stops</td>
                <td className={`num py-1 text-right whitespace-nowrap ${r.overTime ? 'text-clay' : ''}`}>{duration(r.shootSeconds)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
