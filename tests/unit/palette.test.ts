import { describe, expect, it } from 'vitest';
import { palette } from '@/tailwind.config';

// WCAG 2.2, success criterion 1.4.3 (contrast, minimum): 4.5:1 for body text, 3:1 for large text.
// Relative luminance and contrast ratio as the standard defines them (its "relative luminance" entry).
function luminance(hex: string): number {
  const channels = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const [r, g, b] = channels.map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4)) as [
    number,
    number,
    number,
  ];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

function contrast(a: string, b: string): number {
  const [light, dark] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (light + 0.05) / (dark + 0.05);
}

describe('the palette meets WCAG 2.2 AA contrast', () => {
  it('checks the formula on the standard’s extremes', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrast('#777777', '#777777')).toBe(1);
  });

  const bodyText: [string, string, string, string][] = [
    ['ink', palette.ink.DEFAULT, 'paper', palette.paper.DEFAULT],
    ['ink-soft', palette.ink.soft, 'paper', palette.paper.DEFAULT],
    ['ink-faint', palette.ink.faint, 'paper', palette.paper.DEFAULT],
    ['ink-soft', palette.ink.soft, 'paper-deep', palette.paper.deep],
    ['ink-faint', palette.ink.faint, 'paper-deep', palette.paper.deep],
    ['paper', palette.paper.DEFAULT, 'ink', palette.ink.DEFAULT],
    ['paper', palette.paper.DEFAULT, 'ember', palette.ember.DEFAULT],
    ['ember', palette.ember.DEFAULT, 'paper', palette.paper.DEFAULT],
    ['ember-deep', palette.ember.deep, 'ember-wash', palette.ember.wash],
    ['moss', palette.moss.DEFAULT, 'moss-wash', palette.moss.wash],
  ];

  it.each(bodyText)('%s on %s reaches 4.5:1', (_fg, fg, _bg, bg) => {
    expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
  });
});
