import { CHECK_GLYPHS } from '@shared/check-glyphs';
import { checkHeadline } from '@shared/check-pictures';
import type { CheckSeverity } from '@shared/schemas/checks';
import type { NumberedCheck } from '@shared/schemas/check-views';
import { CheckGlyph } from './check-glyph';

const SEVERITY: Record<CheckSeverity, { word: string; style: string }> = {
  problem: { word: 'Problem', style: 'border-clay/50 text-clay' },
  warning: { word: 'Warning', style: 'border-amber/60 text-[#8a5a12]' },
  info: { word: 'Note', style: 'border-rule text-slate' },
};

/** Each check with its glyph, severity in words, what was found and what to do about it. */
export function CheckList({ checks }: { checks: NumberedCheck[] }) {
  return (
    <ul className="flex flex-col gap-2" aria-label="Checks raised">
      {checks.map((check, i) => {
        const glyph = CHECK_GLYPHS[check.code];
        const severity = SEVERITY[check.severity];
        const headline = checkHeadline(check);
        return (
          <li key={`${check.code}-${i}`} className="rounded border border-rule bg-paper/60 p-2 text-sm" data-testid="check-item">
            <div className="mb-1 flex flex-wrap items-center gap-2">
              <CheckGlyph code={check.code} sizePx={16} decorative />
              <span className="font-semibold">{glyph.label}</span>
              <span className={`rounded border px-1 text-xs font-medium ${severity.style}`}>{severity.word}</span>
              <span className="text-slate">{headline.charAt(0).toUpperCase() + headline.slice(1)}</span>
            </div>
            <p className="text-ink">{check.message}</p>
          </li>
        );
      })}
    </ul>
  );
}
