import { useState } from 'react';
import { Link } from 'react-router';
import type { SessionRow } from '@shared/schemas/session-views';
import { count } from '@/lib/units';
import { shootDate } from '../lib/format';

type SortKey = 'shootDate' | 'title' | 'frameCount' | 'stackCount' | 'looseCount';
const COLUMNS: { key: SortKey; label: string; numeric?: boolean }[] = [
  { key: 'shootDate', label: 'Date', numeric: true },
  { key: 'title', label: 'Title' },
  { key: 'frameCount', label: 'Frames', numeric: true },
  { key: 'stackCount', label: 'Stacks', numeric: true },
  { key: 'looseCount', label: 'Loose frames', numeric: true },
];

function compare(a: SessionRow, b: SessionRow, key: SortKey): number {
  if (key === 'title' || key === 'shootDate') return a[key].localeCompare(b[key]);
  return a[key] - b[key];
}

const matches = (s: SessionRow, q: string) => [s.title, s.subject, s.location].some((v) => v.toLowerCase().includes(q));

/** The studio's shoots; headers sort (again to reverse), the search box matches title, subject and place. */
export function SessionsTable({ sessions, sessionHref }: { sessions: SessionRow[]; sessionHref: (id: string) => string }) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'shootDate', dir: -1 });
  const [query, setQuery] = useState('');
  const q = query.trim().toLowerCase();
  const rows = sessions.filter((s) => !q || matches(s, q)).sort((a, b) => compare(a, b, sort.key) * sort.dir);
  const toggle = (key: SortKey) => setSort((s) => (s.key === key ? { key, dir: s.dir === 1 ? -1 : 1 } : { key, dir: key === 'title' ? 1 : -1 }));
  return (
    <div>
      <label className="mb-3 flex max-w-md items-center gap-2 text-sm">
        <span>Search</span>
        <input type="search" value={query} onChange={(e) => setQuery(e.target.value)} placeholder="title, subject or location" className="flex-1 rounded border border-rule bg-card px-2 py-1" />
      </label>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Sessions; select a column header to sort</caption>
          <thead>
            <tr className="border-b border-rule text-slate">
              {COLUMNS.map((c) => (
                <th key={c.key} scope="col" aria-sort={sort.key === c.key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'} className={`py-2 pr-4 font-medium ${c.numeric ? 'text-right' : 'text-left'}`}>
                  <button type="button" className="inline-flex items-center gap-1 hover:text-ink" onClick={() => toggle(c.key)}>
                    {c.label}
                    <span aria-hidden="true" className="w-3 text-xs">{sort.key === c.key ? (sort.dir === 1 ? '▲' : '▼') : ''}</span>
                  </button>
                </th>
              ))}
              <th scope="col" className="py-2 pr-4 text-left font-medium">Subject · location</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((s) => (
              <tr key={s.id} className="border-b border-rule/60">
                <td className="num py-2 pr-4 text-right whitespace-nowrap">{shootDate(s.shootDate)}</td>
                <td className="py-2 pr-4"><Link to={sessionHref(s.id)} className="text-moss hover:underline">{s.title}</Link></td>
                <td className="num py-2 pr-4 text-right">{count(s.frameCount)}</td>
                <td className="num py-2 pr-4 text-right">{count(s.stackCount)}</td>
                <td className="num py-2 pr-4 text-right">{count(s.looseCount)}</td>
                <td className="py-2 pr-4 text-slate">{[s.subject, s.location].filter(Boolean).join(' · ') || '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {rows.length === 0 ? <p className="py-4 text-sm text-slate">No session matches “{query}”.</p> : null}
      </div>
    </div>
  );
}
