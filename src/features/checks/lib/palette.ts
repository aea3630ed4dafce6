// A sequential palette across frame numbers for the focus map: from a pale sand (the nearest
// frames) to a deep green (the farthest), lightness falling steadily so the order reads in grey too.
// The frame number is written in each cell, so the ramp skips the middle tones (relative luminance
// about 0.18 to 0.27) where neither ink nor white text reaches a 4.5:1 contrast.
const LIGHT = ['#EFE6C8', '#BFD6A6', '#8DBA98'];
const DARK = ['#3F7D68', '#173C36'];

const channels = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
const toHex = (rgb: number[]) => `#${rgb.map((c) => Math.round(c).toString(16).padStart(2, '0')).join('')}`;

function along(ramp: string[], t: number): string {
  const span = t * (ramp.length - 1);
  const i = Math.min(ramp.length - 2, Math.floor(span));
  const [a, b] = [channels(ramp[i]), channels(ramp[i + 1])];
  return toHex(a.map((c, k) => c + (b[k] - c) * (span - i)));
}

/** The colour of frame `number` of `count` (both from 1). */
export function frameColour(number: number, count: number): string {
  const t = count <= 1 ? 0 : Math.min(1, Math.max(0, (number - 1) / (count - 1)));
  return t <= 0.5 ? along(LIGHT, t * 2) : along(DARK, (t - 0.5) * 2);
}

/** WCAG 2.x relative luminance of an sRGB colour. */
export function relativeLuminance(hex: string): number {
  const [r, g, b] = channels(hex).map((c) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** Ink or white, whichever reads better on the background (WCAG 2.x contrast ratio). */
export function textOn(hex: string): '#1F2A30' | '#FFFFFF' {
  const l = relativeLuminance(hex);
  const contrast = (a: number, b: number) => (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
  return contrast(l, relativeLuminance('#1F2A30')) >= contrast(l, 1) ? '#1F2A30' : '#FFFFFF';
}
