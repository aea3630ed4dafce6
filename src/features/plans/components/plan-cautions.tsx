import type { PlanWarning } from '@shared/schemas/plan-input';

const TITLES: Record<PlanWarning['code'], string> = {
  'no-magnification': 'No close-up magnification',
  'dof-unbounded': 'No stack needed',
  'too-many-frames': 'Very many frames',
  'rail-too-coarse': 'Rail too coarse',
  'overlap-reduced': 'Less overlap than asked',
  'diffraction-soft': 'Diffraction softening',
  'all-diffraction-soft': 'Diffraction at every aperture',
  'over-time': 'Shoot time longer than the subject stays still',
  'vibration-risk': 'Vibration with this shutter time',
  'fixed-aperture': 'Fixed aperture',
};

/** The plan's warnings (deduplicated), then the lamp and eye safety note, which always applies. */
export function PlanCautions({ warnings }: { warnings: PlanWarning[] }) {
  const seen = new Set<string>();
  const unique = warnings.filter((w) => !seen.has(w.code) && seen.add(w.code));
  return (
    <div className="flex flex-col gap-3">
      {unique.length > 0 ? (
        <ul aria-label="Cautions for this plan" className="flex flex-col gap-2">
          {unique.map((w) => (
            <li key={w.code} className="rounded border border-amber/50 bg-amber/5 px-3 py-2 text-sm">
              <p className="font-medium text-ink"><span aria-hidden="true" className="mr-1 text-amber">△</span>{TITLES[w.code]}</p>
              <p className="text-ink/90">{w.message}</p>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-slate">No cautions for these settings.</p>
      )}
      <SafetyNote />
    </div>
  );
}

export function SafetyNote() {
  return (
    <aside aria-labelledby="safety-h" className="rounded border border-rule bg-card px-3 py-2 text-sm no-print">
      <h3 id="safety-h" className="font-medium text-ink">Hot lights and eyes</h3>
      <ul className="mt-1 list-disc pl-5 text-ink/90">
        <li>Continuous lamps run hot: keep them clear of subjects, hands and anything that can scorch or melt.</li>
        <li>Never look into a bright source at close range, directly or through the viewfinder.</li>
        <li>Follow your local electrical-safety rules for lamps, cables and power strips.</li>
      </ul>
    </aside>
  );
}
