import type { StackPlan } from '@shared/schemas/plan-input';

const ROWS_PER_COLUMN = 50;

/**
 * Frame number, position in mm and in rail steps from the first frame. Long lists are split into
 * side-by-side columns so up to about 200 frames fit one printed page.
 */
export function StepTable({ plan }: { plan: StackPlan }) {
  const rows = plan.positionsMm.map((mm, i) => ({ frame: i + 1, mm, steps: plan.railSteps?.[i] ?? null }));
  const perColumn = Math.max(ROWS_PER_COLUMN, Math.ceil(rows.length / 4));
  const columns = Array.from({ length: Math.ceil(rows.length / perColumn) }, (_, c) => rows.slice(c * perColumn, (c + 1) * perColumn));
  const hasRail = plan.railSteps !== null;
  return (
    <div className="grid gap-x-6 gap-y-4 sm:grid-cols-2 lg:grid-cols-4 print:grid-cols-4 print:gap-x-4">
      {columns.map((col, c) => (
        <table key={c} className="w-full border-collapse text-sm print:text-[8pt]" aria-label={columns.length > 1 ? `Focus positions, frames ${col[0].frame}–${col[col.length - 1].frame}` : 'Focus positions'}>
          <thead>
            <tr className="border-b border-ink/60 text-right">
              <th scope="col" className="py-0.5 pr-2 font-medium">Frame</th>
              <th scope="col" className="py-0.5 pr-2 font-medium">Position (mm)</th>
              {hasRail ? <th scope="col" className="py-0.5 font-medium">Rail steps</th> : null}
            </tr>
          </thead>
          <tbody>
            {col.map((r) => (
              <tr key={r.frame} className="num border-b border-rule/60 text-right break-inside-avoid">
                <th scope="row" className="py-0.5 pr-2 font-normal">{r.frame}</th>
                <td className="py-0.5 pr-2">{r.mm.toFixed(3)}</td>
                {hasRail ? <td className="py-0.5">{r.steps}</td> : null}
              </tr>
            ))}
          </tbody>
        </table>
      ))}
    </div>
  );
}
