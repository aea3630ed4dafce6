import type { CheckCode } from './schemas/checks';

/**
 * One glyph per check, drawn the same way in the app, on the contact sheet and in the manifest
 * legend: the shape carries the meaning, the colour (a PRODUCT.md "Look" token) repeats it.
 * Paths are in a 16 x 16 box; `fill` parts are filled with the colour, `stroke` parts drawn with
 * a 1.5-unit line of it, so SVG, pdfkit (`doc.path(d)`) and sharp overlays can share them.
 */
export interface CheckGlyph {
  label: string;
  /** a stable name for the shape, used in the manifest legend */
  shape: 'half-filled-circle' | 'broken-bracket' | 'two-stacked-bars' | 'hollow-diamond' | 'hollow-triangle';
  colourToken: 'amber' | 'plum' | 'steel' | 'slate' | 'clay';
  colourHex: `#${string}`;
  /** one line for a legend */
  meaning: string;
  viewBox: '0 0 16 16';
  paths: { d: string; paint: 'fill' | 'stroke' }[];
}

export const CHECK_GLYPH_STROKE_WIDTH = 1.5;

export const CHECK_GLYPHS: Record<CheckCode, CheckGlyph> = {
  'exposure-jump': {
    label: 'Exposure jump',
    shape: 'half-filled-circle',
    colourToken: 'amber',
    colourHex: '#B7791F',
    meaning: 'a frame brighter or darker than its neighbours',
    viewBox: '0 0 16 16',
    paths: [
      { d: 'M8 2.5 A5.5 5.5 0 1 0 8 13.5 A5.5 5.5 0 1 0 8 2.5 Z', paint: 'stroke' },
      { d: 'M8 2.5 A5.5 5.5 0 0 0 8 13.5 Z', paint: 'fill' },
    ],
  },
  'focus-gap': {
    label: 'Focus gap',
    shape: 'broken-bracket',
    colourToken: 'plum',
    colourHex: '#7B3F73',
    meaning: 'a missed focus step: some depth sharp in no frame',
    viewBox: '0 0 16 16',
    paths: [
      { d: 'M10 2.5 H5 V6.5', paint: 'stroke' },
      { d: 'M5 9.5 V13.5 H10', paint: 'stroke' },
    ],
  },
  'duplicate-frame': {
    label: 'Duplicate frame',
    shape: 'two-stacked-bars',
    colourToken: 'steel',
    colourHex: '#4A6FA5',
    meaning: 'two frames at the same focus',
    viewBox: '0 0 16 16',
    paths: [
      { d: 'M2.5 3.5 H13.5 V6.5 H2.5 Z', paint: 'fill' },
      { d: 'M2.5 9.5 H13.5 V12.5 H2.5 Z', paint: 'fill' },
    ],
  },
  'setting-change': {
    label: 'Setting change',
    shape: 'hollow-diamond',
    colourToken: 'slate',
    colourHex: '#5B6B73',
    meaning: 'aperture, focal length or ISO changed inside the stack',
    viewBox: '0 0 16 16',
    paths: [{ d: 'M8 2 L14 8 L8 14 L2 8 Z', paint: 'stroke' }],
  },
  'plan-mismatch': {
    label: 'Plan mismatch',
    shape: 'hollow-triangle',
    colourToken: 'clay',
    colourHex: '#A4452C',
    meaning: 'frame count or shooting time differs from the linked plan',
    viewBox: '0 0 16 16',
    paths: [{ d: 'M8 2.5 L14 13.5 H2 Z', paint: 'stroke' }],
  },
};
