import type { CSSProperties } from 'react';
import type { StackPlan } from '@shared/schemas/plan-input';

const ROWS_PER_COLUMN = 60;
const MAX_COLUMNS = 5;

/**
 * Frame number, position in mm and in rail steps from the first frame. Long lists are split into
 * side-by-side columns so up to about 300 frames fit one printed A4 page.
 */
export function StepTable({ plan }: { plan: StackPlan }) {
  const rows = plan.positionsMm.map((mm, i) => ({ frame: i + 1, mm, steps: plan.railSteps?.[i] ?? null }));
  const perColumn = Math.max(ROWS_PER_COLUMN, Math.ceil(rows.length / MAX_COLUMNS));
  const columns = Array.from({ length: Math.ceil(rows.length / perColumn) }, (_, c) => rows.slice(c * perColumn, (c + 1) * perColumn));
  const hasRail = plan.railSteps !== null;
  const decimals = plan.stepMm !== null && plan.stepMm < 0.01 ? 4 : 3;
  const style = { '--step-columns': columns.length } as CSSProperties;
  return (
    <div style={style} className="grid items-start gap-x-6 gap-y-4 sm:grid-cols-2 lg:grid-cols-4 print:grid-cols-[repeat(var(--step-columns),minmax(0,1fr))] print:gap-x-4">
      {columns.map((col, c) => (
        <table key={c} className="w-full border-collapse text-sm print:text-[7.5pt] print:leading-tight" aria-label={columns.length > 1 ? `Focus positions, frames ${col[0].frame}–${col[col.length - 1].frame}` : 'Focus positions'}>
          <thead>
            <tr className="border-b border-ink/60 text-right">
              <th scope="col" className="py-0.5 pr-2 font-medium print:py-0">Frame</th>
              <th scope="col" className="py-0.5 pr-2 font-medium print:py-0">Position (mm)</th>
              {hasRail ? <th scope="col" className="py-0.5 font-medium print:py-0">Rail steps</th> : null}
            </tr>
          </thead>
          <tbody>
            {col.map((r) => (
              <tr key={r.frame} className="num border-b border-rule/60 text-right break-inside-avoid">
                <th scope="row" className="py-0.5 pr-2 font-normal print:py-0">{r.frame}</th>
                <td className="py-0.5 pr-2 print:py-0">{r.mm.toFixed(decimals)}</td>
                {hasRail ? <td className="py-0.5 print:py-0">{r.steps}</td> : null}
              </tr>
            ))}
          </tbody>
        </table>
      ))}
    </div>
  );
}
