import fs from 'node:fs';
import { describe, expect, it } from 'vitest';

// The map's lines and mark borders must stand out from the graph's surface in both themes.
const css = fs.readFileSync('src/styles.css', 'utf8');

function tokens(selector: ':root' | '.dark'): Map<string, string> {
  const start = css.indexOf(`${selector} {`);
  const block = css.slice(start, css.indexOf('}', start));
  return new Map([...block.matchAll(/--(pp-[a-z-]+):\s*(#[0-9a-f]{6})/gi)].map((m) => [m[1], m[2]]));
}

// WCAG 2.2, definition of "relative luminance" (sRGB, linearised with the 0.04045 threshold).
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

// WCAG 2.2, definition of "contrast ratio": (L1 + 0.05) / (L2 + 0.05).
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('map colours', () => {
  it('computes contrast as WCAG defines it', () => {
    // WCAG 2.2: black on white is 21:1, and a colour on itself 1:1.
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrast('#767676', '#767676')).toBe(1);
    // #767676 on white is the familiar 4.54:1 (from memory; the formula above gives it).
    expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
  });

  for (const theme of [':root', '.dark'] as const) {
    it(`keeps every link colour and the marks' border at 3:1 or more on the graph (${theme === ':root' ? 'light' : 'dark'}, WCAG 2.2 SC 1.4.11)`, () => {
      const t = tokens(theme);
      const surface = t.get('pp-surface')!;
      for (const name of ['pp-link-comfortable', 'pp-link-thin', 'pp-link-at-risk', 'pp-link-unknown', 'pp-line-strong', 'pp-ink']) {
        const colour = t.get(name);
        expect(colour, name).toMatch(/^#/);
        expect(contrast(colour!, surface), `${name} ${colour} on ${surface}`).toBeGreaterThanOrEqual(3);
      }
    });
  }
});
