import { checkCodeSchema } from '@shared/schemas/checks';
import { CheckGlyph } from './check-glyph';

/**
 * The marks of one frame, for frame tiles on the sorting and stack pages: a check's glyph (named
 * for screen readers and on hover), or a plain ring named in words for any other mark.
 */
export function FrameCheckBadges({ codes, sizePx = 13 }: { codes: string[]; sizePx?: number }) {
  if (codes.length === 0) return null;
  return (
    <span className="inline-flex flex-wrap items-center gap-0.5" data-testid="frame-check-badges">
      {codes.map((code) => {
        const known = checkCodeSchema.safeParse(code);
        if (known.success) return <CheckGlyph key={code} code={known.data} sizePx={sizePx} />;
        const words = code.replaceAll('-', ' ');
        return (
          <svg key={code} viewBox="0 0 16 16" width={sizePx} height={sizePx} role="img" aria-label={words} className="inline-block shrink-0">
            <title>{words}</title>
            <circle cx="8" cy="8" r="5.5" fill="none" stroke="#5B6B73" strokeWidth={1.5} />
          </svg>
        );
      })}
    </span>
  );
}
