import { useEffect, useRef, useState } from 'react';
import { groupingOptionsSchema, type GroupingOptionsInput } from '@shared/schemas/sessions';
import type { SortingView } from '@shared/schemas/session-views';
import { TextField } from '@/components/text-field';

const DEBOUNCE_MS = 600;
type Options = SortingView['groupingOptions'];
type Field = 'gapFactor' | 'minGapS' | 'minStackSize';

/** The gap rule, tuned live: a change re-groups the card after a short pause in typing. */
export function GapControl({ options, disabled, pending, onRegroup }: { options: Options; disabled: boolean; pending: boolean; onRegroup: (o: GroupingOptionsInput) => void }) {
  const [text, setText] = useState<Record<Field, string>>({ gapFactor: String(options.gapFactor), minGapS: String(options.minGapS), minStackSize: String(options.minStackSize) });
  const [problem, setProblem] = useState<Partial<Record<Field, string>>>({});
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => () => { if (timer.current) clearTimeout(timer.current); }, []);

  const change = (field: Field, value: string) => {
    const next = { ...text, [field]: value };
    setText(next);
    if (timer.current) clearTimeout(timer.current);
    const parsed = groupingOptionsSchema.safeParse({ gapFactor: Number(next.gapFactor), minGapS: Number(next.minGapS), minStackSize: Number(next.minStackSize) });
    if (!parsed.success || Object.values(next).some((v) => v.trim() === '')) {
      setProblem(Object.fromEntries((parsed.error?.issues ?? []).map((i) => [String(i.path[0]), i.message])));
      return;
    }
    setProblem({});
    timer.current = setTimeout(() => onRegroup(parsed.data), DEBOUNCE_MS);
  };

  return (
    <fieldset className="rounded border border-rule bg-card p-3" disabled={disabled}>
      <legend className="px-1 text-sm font-semibold">Gap rule</legend>
      <div className="flex flex-wrap items-start gap-4">
        <TextField label="Gap factor" unit="× median gap" type="number" inputMode="decimal" step={0.5} min={1} max={50} className="w-44"
          value={text.gapFactor} onChange={(e) => change('gapFactor', e.target.value)} error={problem.gapFactor} />
        <TextField label="Smallest gap" unit="s" type="number" inputMode="decimal" step={0.5} min={0} max={3600} className="w-32"
          value={text.minGapS} onChange={(e) => change('minGapS', e.target.value)} error={problem.minGapS} />
        <TextField label="Smallest stack" unit="frames" type="number" inputMode="numeric" step={1} min={2} max={100} className="w-36"
          value={text.minStackSize} onChange={(e) => change('minStackSize', e.target.value)} error={problem.minStackSize} />
        <p className="max-w-sm text-xs text-slate">
          A new stack starts where the pause before a frame is longer than the factor times the recent pauses, and longer than the smallest gap.
          Re-grouping replaces <strong>draft</strong> stacks; stacks marked ready stay as they are. Undo brings the previous grouping back.
        </p>
        <p className="self-center text-sm text-slate" role="status">{pending ? 'Re-grouping…' : ''}</p>
      </div>
    </fieldset>
  );
}
