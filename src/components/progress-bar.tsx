/** A determinate progress bar in the accent colour; `label` names it for screen readers. */
export function ProgressBar({ percent, label, id, thin = false }: { percent: number; label: string; id?: string; thin?: boolean }) {
  const value = Math.max(0, Math.min(100, Math.round(percent)));
  return (
    <div
      id={id}
      role="progressbar"
      aria-label={label}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={value}
      aria-valuetext={`${value} %`}
      className={`w-full overflow-hidden rounded-full bg-rule/70 ${thin ? 'h-1.5' : 'h-2.5'}`}
    >
      <div className="h-full rounded-full bg-moss transition-[width] duration-150" style={{ width: `${value}%` }} />
    </div>
  );
}
