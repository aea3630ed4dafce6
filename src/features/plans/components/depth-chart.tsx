import { CartesianGrid, Line, LineChart, ReferenceDot, Tooltip, XAxis, YAxis } from 'recharts';
import { framesFor } from '@shared/optics';
import { length, sig } from '@/lib/units';

/** How the frame count grows with the depth to cover, at the planned step; the planned depth is marked. */
export function DepthChart({ depthMm, stepMm, frames }: { depthMm: number; stepMm: number | null; frames: number }) {
  if (stepMm === null) return <p className="text-sm text-slate">One frame covers any depth at these settings.</p>;
  const maxDepth = depthMm * 2;
  const data = Array.from({ length: 41 }, (_, i) => {
    const d = (maxDepth * i) / 40;
    return { depthMm: Number(d.toPrecision(6)), frames: d === 0 ? 1 : framesFor(d, stepMm) };
  });
  return (
    <figure className="min-w-0">
      <figcaption className="mb-2 text-sm text-slate">
        Frames needed for 0 – {sig(maxDepth)} mm of depth at a {length(stepMm)} step; the plan covers {sig(depthMm)} mm in {frames} frames.
      </figcaption>
      <LineChart responsive style={{ width: '100%', height: 200 }} data={data} margin={{ top: 12, right: 12, bottom: 16, left: 0 }} accessibilityLayer={false}>
        <CartesianGrid stroke="#D9D4CA" strokeDasharray="2 4" />
        <XAxis dataKey="depthMm" type="number" domain={[0, maxDepth]} tick={{ fontSize: 11, fill: '#5B6B73' }} tickFormatter={(d: number) => sig(d)} label={{ value: 'depth (mm)', position: 'insideBottom', offset: -8, fontSize: 11, fill: '#5B6B73' }} />
        <YAxis tick={{ fontSize: 11, fill: '#5B6B73' }} width={44} allowDecimals={false} label={{ value: 'frames', angle: -90, position: 'insideLeft', fontSize: 11, fill: '#5B6B73' }} />
        <Tooltip formatter={(v) => `${v} frames`} labelFormatter={(d) => `${sig(Number(d))} mm deep`} />
        <Line dataKey="frames" type="stepAfter" stroke="#2F6F5E" strokeWidth={2} dot={false} isAnimationActive={false} />
        <ReferenceDot x={Number(depthMm.toPrecision(6))} y={frames} r={5} fill="#B7791F" stroke="#1F2A30" />
      </LineChart>
    </figure>
  );
}
