/**
 * Readable contrast in both themes. The colours are read from the app's style sheet
 * (renderer/src/styles/app.css), and each pair of text and background the screens use is
 * checked with the WCAG 2.x formula.
 *
 * Source: W3C, Web Content Accessibility Guidelines (WCAG) 2.2, Recommendation 2023,
 * definitions "relative luminance" (sRGB channels linearised: c/12.92 at or below 0.04045,
 * else ((c+0.055)/1.055)^2.4; L = 0.2126 R + 0.7152 G + 0.0722 B) and "contrast ratio"
 * ((L1 + 0.05) / (L2 + 0.05), lighter over darker); thresholds of success criteria 1.4.3
 * (text: 4.5:1) and 1.4.11 (outlines of controls and focus indicators: 3:1).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const css = readFileSync(join(import.meta.dirname, '../../../renderer/src/styles/app.css'), 'utf8');

function theme(name: 'light' | 'dark'): Record<string, string> {
  const start = css.indexOf(`:root[data-theme='${name}']`);
  expect(start).toBeGreaterThanOrEqual(0);
  const body = css.slice(css.indexOf('{', start) + 1, css.indexOf('}', start));
  return Object.fromEntries([...body.matchAll(/--([\w-]+):\s*(#[0-9a-fA-F]{6})\s*;/g)].map((m) => [m[1], m[2]]));
}

function relativeLuminance(hex: string): number {
  const n = parseInt(hex.slice(1), 16);
  const channel = (c: number): number => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel((n >> 16) & 255) + 0.7152 * channel((n >> 8) & 255) + 0.0722 * channel(n & 255);
}

function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

/** Text colours and the backgrounds they are drawn on in the screens. */
const TEXT: Array<[string, string[]]> = [
  ['ink', ['bg', 'panel', 'panel-2', 'row-alt', 'accent-soft', 'caution-soft', 'derived-soft']],
  ['muted', ['bg', 'panel', 'panel-2', 'row-alt', 'accent-soft']],
  ['accent', ['bg', 'panel', 'panel-2', 'accent-soft']],
  ['accent-ink', ['accent']],
  ['caution', ['panel', 'caution-soft']],
  ['danger', ['bg', 'panel']],
  ['derived', ['panel', 'derived-soft']],
];
/** Outlines that say "this can be pressed or typed in", and the focus ring. */
const NON_TEXT: Array<[string, string[]]> = [
  ['control-line', ['bg', 'panel', 'panel-2']],
  ['focus', ['bg', 'panel', 'panel-2', 'row-alt', 'accent-soft']],
];

describe('WCAG 2.x contrast ratio', () => {
  it('follows the definition: black on white is 21:1, a colour on itself 1:1', () => {
    // The range of the ratio is 1 to 21 (WCAG 2.2, definition of contrast ratio).
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 6);
    expect(contrastRatio('#56605f', '#56605f')).toBe(1);
    // #767676 on white is about 4.54:1, the lightest grey commonly cited as passing 1.4.3 (from memory).
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
    expect(contrastRatio('#777777', '#ffffff')).toBeLessThan(4.5);
  });
});

describe.each(['light', 'dark'] as const)('%s theme', (name) => {
  const colours = theme(name);

  it.each(TEXT)('text in --%s reads at 4.5:1 or more on its backgrounds', (fg, backgrounds) => {
    for (const bg of backgrounds) {
      expect(colours[fg], `--${fg}`).toMatch(/^#/);
      expect(colours[bg], `--${bg}`).toMatch(/^#/);
      expect(contrastRatio(colours[fg], colours[bg]), `--${fg} on --${bg}`).toBeGreaterThanOrEqual(4.5);
    }
  });

  it.each(NON_TEXT)('--%s stands out at 3:1 or more', (fg, backgrounds) => {
    for (const bg of backgrounds) expect(contrastRatio(colours[fg], colours[bg]), `--${fg} on --${bg}`).toBeGreaterThanOrEqual(3);
  });
});
