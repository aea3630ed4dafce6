import { useState } from 'react';
import { Link } from 'react-router';
import type { PlanSummary } from '@shared/schemas/plan';
import { count, magnification, sig } from '@/lib/units';

type SortKey = 'name' | 'magnification' | 'frames' | 'stepMm' | 'updatedAt';
const COLUMNS: { key: SortKey; label: string; numeric?: boolean }[] = [
  { key: 'name', label: 'Name' },
  { key: 'magnification', label: 'Magnification', numeric: true },
  { key: 'frames', label: 'Frames', numeric: true },
  { key: 'stepMm', label: 'Step', numeric: true },
  { key: 'updatedAt', label: 'Updated', numeric: true },
];

function compare(a: PlanSummary, b: PlanSummary, key: SortKey): number {
  if (key === 'name') return a.name.localeCompare(b.name);
  if (key === 'updatedAt') return a.updatedAt.localeCompare(b.updatedAt);
  return (a[key] ?? Infinity) - (b[key] ?? Infinity);
}

/** Saved plans; each column header sorts (again to reverse). */
export function PlansTable({ plans, planHref }: { plans: PlanSummary[]; planHref: (id: string) => string }) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'updatedAt', dir: -1 });
  const rows = [...plans].sort((a, b) => compare(a, b, sort.key) * sort.dir);
  const toggle = (key: SortKey) => setSort((s) => (s.key === key ? { key, dir: s.dir === 1 ? -1 : 1 } : { key, dir: key === 'name' ? 1 : -1 }));
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Saved plans; select a column header to sort</caption>
        <thead>
          <tr className="border-b border-rule text-slate">
            {COLUMNS.map((c) => (
              <th
                key={c.key}
                scope="col"
                aria-sort={sort.key === c.key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}
                className={`py-2 pr-4 font-medium ${c.numeric ? 'text-right' : 'text-left'}`}
              >
                <button type="button" className="inline-flex items-center gap-1 hover:text-ink" onClick={() => toggle(c.key)}>
                  {c.label}
                  <span aria-hidden="true" className="w-3 text-xs">{sort.key === c.key ? (sort.dir === 1 ? '▲' : '▼') : ''}</span>
                </button>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((p) => (
            <tr key={p.id} className="border-b border-rule/60">
              <td className="py-2 pr-4"><Link to={planHref(p.id)} className="text-moss hover:underline">{p.name}</Link></td>
              <td className="num py-2 pr-4 text-right whitespace-nowrap">{magnification(p.magnification)}</td>
              <td className="num py-2 pr-4 text-right">{count(p.frames)}</td>
              <td className="num py-2 pr-4 text-right whitespace-nowrap">{p.stepMm === null ? '—' : `${sig(p.stepMm * 1000)} µm`}</td>
              <td className="num py-2 pr-4 text-right whitespace-nowrap">{new Date(p.updatedAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
