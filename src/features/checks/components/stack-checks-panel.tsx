import { useEffect, useMemo, useRef } from 'react';
import { summariseChecks } from '@shared/check-pictures';
import type { StackChecksView } from '@shared/schemas/check-views';
import { QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useStackChecks } from '../api/get-stack-checks';
import { CheckList } from './check-list';
import { ExposureStrip } from './exposure-strip';
import { FocusMap } from './focus-map';

interface Props {
  stackId: string;
  /** called when fresh results arrive, so the page can read its frame marks again */
  onResultsChanged?: () => void;
}

/** The stack's checks on the stack page: a summary, each check with advice, and the pictures behind them. */
export function StackChecksPanel({ stackId, onResultsChanged }: Props) {
  const { studioId } = useActiveStudio();
  const checks = useStackChecks(studioId, stackId);
  const computedAt = checks.data?.status === 'current' ? checks.data.computedAt : null;
  const seen = useRef<string | null>(null);
  useEffect(() => {
    if (computedAt && seen.current !== null && seen.current !== computedAt) onResultsChanged?.();
    if (computedAt) seen.current = computedAt;
  }, [computedAt, onResultsChanged]);
  return (
    <section aria-labelledby="checks-h" className="rounded border border-rule bg-card p-4">
      <h2 id="checks-h" className="mb-2 text-lg font-semibold">Checks</h2>
      <QueryState isPending={checks.isPending} error={checks.error} label="checks">
        {checks.data ? <ChecksBody view={checks.data} /> : null}
      </QueryState>
    </section>
  );
}

function ChecksBody({ view }: { view: StackChecksView }) {
  const { results, status } = view;
  const pictures = useMemo(() => {
    if (!results) return null;
    const jumpNumbers = new Set(results.checks.filter((c) => c.code === 'exposure-jump').flatMap((c) => c.frameNumbers));
    const gapCells = new Map<number, string>();
    for (const c of results.checks) if (c.code === 'focus-gap') for (const cell of c.region?.cells ?? []) gapCells.set(cell, c.frameNumbers.join('–'));
    return { jumpNumbers, gapCells, lastNumber: Math.max(1, ...results.frames.map((f) => f.number)) };
  }, [results]);
  return (
    <div className="flex flex-col gap-3">
      <StatusNote view={view} />
      {results && pictures ? (
        <>
          <p className={`font-medium ${results.checks.length ? 'text-ink' : 'text-moss'} ${status === 'current' ? '' : 'opacity-70'}`} data-testid="checks-summary">
            {summariseChecks(results.checks)}
          </p>
          {results.checks.length ? <CheckList checks={results.checks} /> : null}
          {results.excludedFrames ? (
            <p className="text-xs text-slate">{results.excludedFrames} excluded frame{results.excludedFrames === 1 ? ' is' : 's are'} left out of the checks: they are not merged.</p>
          ) : null}
          {results.frames.some((f) => f.stops !== null) ? <ExposureStrip frames={results.frames} jumpNumbers={pictures.jumpNumbers} limitStops={view.thresholds.exposureJumpStops} /> : null}
          {results.focusMap ? <FocusMap map={results.focusMap} frameCount={results.frames.length} lastNumber={pictures.lastNumber} gapCells={pictures.gapCells} /> : null}
          <p className="text-xs text-slate">
            Limits: an exposure jump above {view.thresholds.exposureJumpStops.toFixed(2)} stops, a focus gap above {view.thresholds.focusGapStepRatio}× the usual
            step. The studio’s limits are set on the Studio page.
          </p>
        </>
      ) : null}
    </div>
  );
}

function StatusNote({ view }: { view: StackChecksView }) {
  if (view.status === 'current') return null;
  const text = view.status === 'waiting-for-previews'
    ? `Measuring the frames: ${view.previews.pending} of ${view.previews.total} previews are still being made. The checks run once they are all in.`
    : 'Checking the stack again after the latest change…';
  return <p role="status" className="text-sm text-slate">{text}{view.results ? ' The results below are from before it.' : ''}</p>;
}
