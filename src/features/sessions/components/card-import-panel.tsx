import { useState, type DragEvent } from 'react';
import { Button } from '@/components/button';
import { ProgressBar } from '@/components/progress-bar';
import { count } from '@/lib/units';
import { useCardImport } from '../hooks/use-card-import';
import { importTotals, PARALLEL_UPLOADS, type ImportItem } from '../lib/card-import-engine';
import { fromDrop, fromFileList, splitHidden, type PickedFile } from '../lib/picked-files';
import { bytes } from '../lib/format';

const STATUS_TEXT: Record<ImportItem['status'], string> = {
  waiting: 'waiting',
  hashing: 'checking',
  queued: 'queued',
  uploading: 'uploading',
  stored: 'stored',
  duplicate: 'already stored',
  skipped: 'skipped',
  refused: 'refused',
  failed: 'failed',
};
const STATUS_TONE: Partial<Record<ImportItem['status'], string>> = { refused: 'text-clay', failed: 'text-clay', stored: 'text-moss' };

/** Pick files, a card folder, or drop them; each file uploads on its own with its own progress. */
export function CardImportPanel({ studioId, sessionId }: { studioId: string; sessionId: string }) {
  const { engine, snapshot, busy } = useCardImport(studioId, sessionId);
  const [dragging, setDragging] = useState(false);
  const totals = importTotals(snapshot.items);
  const start = (picked: PickedFile[]) => {
    const { kept, hiddenCount } = splitHidden(picked);
    if (kept.length) void engine.start(kept, hiddenCount);
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    if (!busy) void fromDrop(e.dataTransfer).then(start);
  };
  const attention = snapshot.items.filter((it) => it.status === 'failed' || it.status === 'refused');

  return (
    <section aria-labelledby="import-h" className="mb-8">
      <h2 id="import-h" className="mb-2 text-lg font-semibold">Card import</h2>
      <div
        onDragOver={(e) => { e.preventDefault(); setDragging(true); }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`flex flex-wrap items-center gap-3 rounded border-2 border-dashed px-4 py-5 ${dragging ? 'border-moss bg-moss/5' : 'border-rule bg-card'}`}
      >
        <p className="text-sm text-slate">Drop files or a whole card folder here, or</p>
        <FilePickButton label="Choose files" disabled={busy} onPick={start} />
        <FilePickButton label="Choose a card folder" folder disabled={busy} onPick={start} />
        <p className="basis-full text-xs text-slate">
          Files are checked by content; {PARALLEL_UPLOADS} upload at a time. Files this session already holds are skipped, so picking the same card again resumes an interrupted import.
        </p>
      </div>

      {snapshot.phase !== 'idle' ? (
        <div className="mt-4 rounded border border-rule bg-card p-4">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <p className="text-sm font-medium" data-testid="import-phase">
              {phaseText(snapshot.phase)} · <span className="num">{totals.percent} %</span>
            </p>
            <span className="num text-sm text-slate">
              {count(totals.settled)} of {count(snapshot.items.length)} files · {bytes(totals.doneBytes)} of {bytes(totals.totalBytes)}
            </span>
          </div>
          <div className="mt-2"><ProgressBar label="Whole import" percent={totals.percent} /></div>
          <p className="num mt-2 text-sm text-slate" role="status">
            {count(totals.stored)} stored · {count(totals.duplicate)} already there · {count(totals.refused)} refused · {count(totals.failed)} failed
            {snapshot.hiddenCount ? ` · ${count(snapshot.hiddenCount)} hidden system ${snapshot.hiddenCount === 1 ? 'file' : 'files'} left out` : ''}
          </p>
          {snapshot.error ? <p role="alert" className="mt-2 text-sm text-clay">{snapshot.error}</p> : null}
          <div className="mt-3 flex flex-wrap gap-2">
            {busy && snapshot.phase === 'running' ? <Button variant="secondary" onClick={() => engine.stop()}>Stop import</Button> : null}
            {snapshot.phase === 'needs-attention' && totals.failed ? (
              <>
                <Button onClick={() => engine.retry()}>Retry {count(totals.failed)} failed</Button>
                <Button variant="secondary" onClick={() => void engine.finish()}>Finish without them</Button>
              </>
            ) : null}
          </div>
          {attention.length ? (
            <ul aria-label="Files that need attention" className="mt-3 space-y-1 text-sm">
              {attention.map((it) => (
                <li key={it.key} className="flex flex-wrap items-center gap-2">
                  <span className="font-medium break-all">{it.path}</span>
                  <span className="text-clay">{STATUS_TEXT[it.status]}: {it.message}</span>
                  {it.status === 'failed' && snapshot.phase === 'needs-attention' ? (
                    <Button variant="quiet" onClick={() => engine.retry([it.key])} aria-label={`Retry ${it.path}`}>Retry</Button>
                  ) : null}
                </li>
              ))}
            </ul>
          ) : null}
          <details className="mt-3">
            <summary className="cursor-pointer text-sm text-moss">Every file ({count(snapshot.items.length)})</summary>
            <ul aria-label="Files of this import" className="mt-2 max-h-72 overflow-y-auto pr-2 text-sm">
              {snapshot.items.map((it) => <FileRow key={it.key} item={it} />)}
            </ul>
          </details>
        </div>
      ) : null}
    </section>
  );
}

function phaseText(phase: string): string {
  switch (phase) {
    case 'running': return 'Importing';
    case 'finishing': return 'Sorting the card';
    case 'done': return 'Import finished';
    case 'needs-attention': return 'Some files need attention';
    case 'error': return 'The import could not start';
    default: return '';
  }
}

function FileRow({ item }: { item: ImportItem }) {
  const pct = item.sizeBytes ? Math.floor((item.loadedBytes / item.sizeBytes) * 100) : 100;
  return (
    <li className="grid grid-cols-[minmax(0,1fr)_6rem_7rem_6rem] items-center gap-3 border-b border-rule/60 py-1">
      <span className="truncate" title={item.path}>{item.path}</span>
      <span className="num text-right text-slate">{bytes(item.sizeBytes)}</span>
      <div role="progressbar" aria-label={item.path} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="h-1.5 w-full overflow-hidden rounded-full bg-rule/60">
        <div className="h-full rounded-full bg-moss" style={{ width: `${pct}%` }} />
      </div>
      <span className={`text-xs ${STATUS_TONE[item.status] ?? 'text-slate'}`} title={item.message ?? undefined}>{STATUS_TEXT[item.status]}</span>
    </li>
  );
}

function FilePickButton({ label, folder = false, disabled, onPick }: { label: string; folder?: boolean; disabled: boolean; onPick: (files: PickedFile[]) => void }) {
  return (
    <label className={`relative inline-flex cursor-pointer items-center rounded border border-rule bg-card px-3 py-1.5 text-sm font-medium text-ink focus-within:outline-2 focus-within:outline-moss hover:border-slate ${disabled ? 'cursor-not-allowed opacity-60' : ''}`}>
      {label}
      <input
        type="file"
        multiple
        disabled={disabled}
        className="sr-only"
        data-testid={folder ? 'card-folder-input' : 'card-files-input'}
        ref={(el) => {
          // React knows no webkitdirectory prop; the attribute makes the picker choose a folder.
          if (el && folder) el.setAttribute('webkitdirectory', '');
        }}
        onChange={(e) => {
          onPick(fromFileList(e.currentTarget.files));
          e.currentTarget.value = '';
        }}
      />
    </label>
  );
}
