import { useMemo, useState } from 'react';
import {
  createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState,
} from '@tanstack/react-table';
import type { SessionFileView, SortingView } from '@shared/schemas/session-views';
import { QueryState, EmptyState } from '@/components/query-state';
import { count } from '@/lib/units';
import { clockNote } from '@/lib/capture-time';
import { useSessionFiles } from '../api/get-session-files';
import { aperture, bytes, captureDateTime, flagLabel, focal, isoSpeed, shutter } from '../lib/format';

interface FileRow {
  id: string;
  name: string;
  kind: string;
  captureTimeMs: number | null;
  captureOffsetMinutes: number | null;
  exposureTimeS: number | null;
  fNumber: number | null;
  iso: number | null;
  focalLengthMm: number | null;
  body: string;
  sizeBytes: number;
  flags: string;
  place: string;
}

const col = createColumnHelper<FileRow>();
const numeric = { meta: { numeric: true } };
const columns = [
  col.accessor('name', { header: 'File' }),
  col.accessor('kind', { header: 'Kind' }),
  col.accessor('place', { header: 'Stack' }),
  col.accessor('captureTimeMs', { header: 'Captured', cell: (c) => <span title={clockNote(c.row.original.captureOffsetMinutes)}>{captureDateTime(c.getValue(), c.row.original.captureOffsetMinutes)}</span>, sortUndefined: 'last', ...numeric }),
  col.accessor('exposureTimeS', { header: 'Shutter', cell: (c) => shutter(c.getValue()), ...numeric }),
  col.accessor('fNumber', { header: 'F-number', cell: (c) => aperture(c.getValue()), ...numeric }),
  col.accessor('iso', { header: 'ISO', cell: (c) => isoSpeed(c.getValue()), ...numeric }),
  col.accessor('focalLengthMm', { header: 'Focal length', cell: (c) => focal(c.getValue()), ...numeric }),
  col.accessor('body', { header: 'Body' }),
  col.accessor('sizeBytes', { header: 'Size', cell: (c) => bytes(c.getValue()), ...numeric }),
  col.accessor('flags', { header: 'Flags', enableSorting: false }),
];

function rowsOf(files: SessionFileView[], view: SortingView | undefined): FileRow[] {
  const place = new Map<string, string>();
  for (const s of view?.stacks ?? []) for (const f of s.frames) place.set(f.id, f.excluded ? `${s.name} (excluded)` : s.name);
  for (const f of view?.loose ?? []) place.set(f.id, 'loose');
  return files.map((f) => ({
    id: f.id,
    name: f.name,
    kind: f.isRaw ? `${f.kind} (RAW)` : f.kind,
    captureTimeMs: f.captureTimeMs,
    captureOffsetMinutes: f.metadata.offsetMinutes ?? null,
    exposureTimeS: f.metadata.exposureTimeS ?? null,
    fNumber: f.metadata.fNumber ?? null,
    iso: f.metadata.iso ?? null,
    focalLengthMm: f.metadata.focalLengthMm ?? null,
    body: f.metadata.bodySerial ?? '—',
    sizeBytes: f.sizeBytes,
    flags: f.flags.map(flagLabel).join(', '),
    place: f.frameId ? place.get(f.frameId) ?? '—' : '—',
  }));
}

/** Every stored file of the session with its metadata; headers sort, the box filters. */
export function FrameTable({ studioId, sessionId, view }: { studioId: string; sessionId: string; view: SortingView | undefined }) {
  const files = useSessionFiles(studioId, sessionId);
  const data = useMemo(() => rowsOf(files.data ?? [], view), [files.data, view]);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'captureTimeMs', desc: false }]);
  const [filter, setFilter] = useState('');
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    globalFilterFn: 'includesString',
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId: (r) => r.id,
  });
  const shown = table.getRowModel().rows;

  return (
    <section aria-labelledby="files-h" className="mb-8">
      <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
        <h2 id="files-h" className="text-lg font-semibold">Every file</h2>
        <label className="flex items-center gap-2 text-sm">
          <span>Filter</span>
          <input type="search" value={filter} onChange={(e) => setFilter(e.target.value)} placeholder="name, kind, stack, flag…" className="w-64 rounded border border-rule bg-card px-2 py-1" />
        </label>
      </div>
      <QueryState isPending={files.isPending} error={files.error} label="files">
        {data.length === 0 ? (
          <EmptyState title="No files stored yet" />
        ) : (
          <div className="max-h-[32rem] overflow-auto rounded border border-rule bg-card">
            <table className="w-full border-collapse text-sm">
              <caption className="sr-only">Files of this session; select a column header to sort</caption>
              <thead className="sticky top-0 bg-card">
                {table.getHeaderGroups().map((hg) => (
                  <tr key={hg.id} className="border-b border-rule text-slate">
                    {hg.headers.map((h) => {
                      const sorted = h.column.getIsSorted();
                      const isNumeric = (h.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                      return (
                        <th key={h.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'} className={`px-2 py-2 font-medium whitespace-nowrap ${isNumeric ? 'text-right' : 'text-left'}`}>
                          {h.column.getCanSort() ? (
                            <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-ink">
                              {flexRender(h.column.columnDef.header, h.getContext())}
                              <span aria-hidden="true" className="w-3 text-xs">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}</span>
                            </button>
                          ) : flexRender(h.column.columnDef.header, h.getContext())}
                        </th>
                      );
                    })}
                  </tr>
                ))}
              </thead>
              <tbody>
                {shown.map((row) => (
                  <tr key={row.id} className="border-b border-rule/60">
                    {row.getVisibleCells().map((cell) => {
                      const isNumeric = (cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                      return (
                        <td key={cell.id} className={`px-2 py-1.5 ${isNumeric ? 'num text-right whitespace-nowrap' : cell.column.id === 'flags' ? 'text-clay' : 'break-all'}`}>
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      );
                    })}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="num mt-2 text-sm text-slate" role="status">{count(shown.length)} of {count(data.length)} files shown</p>
      </QueryState>
    </section>
  );
}
