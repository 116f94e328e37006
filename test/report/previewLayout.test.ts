/** Text layout of the preview (src/report/previewLayout.ts): ring labels stay inside, the legend reports how wide it is. */
import { describe, expect, it } from 'vitest';
import { FONT_PX, legendRow, ringLabel, textWidth } from '../../src/report/previewLayout.js';

describe('preview text layout', () => {
  it('a ring label goes upper right, flips left near the right edge when it fits there, and drops below near the top', () => {
    const w = textWidth('0.0123 mm');
    const free = ringLabel('0.0123 mm', 100, 100, 7, 400, '#000');
    expect([free.x, free.y]).toEqual([100 + 1.4 * 7, 100 - 1.2 * 7]);
    const nearRight = ringLabel('0.0123 mm', 390, 100, 7, 400, '#000');
    expect(nearRight.x + nearRight.w).toBeLessThanOrEqual(390 - 1.4 * 7);
    // No room on either side: it stays right (the caller grows the canvas to x + w).
    const tight = ringLabel('0.0123 mm', 20, 100, 7, 40, '#000');
    expect(tight.x).toBe(20 + 1.4 * 7);
    const nearTop = ringLabel('0.0123 mm', 100, 3, 7, 400, '#000');
    expect(nearTop.y - FONT_PX).toBeGreaterThanOrEqual(0);
    expect(free.w).toBe(w);
    expect(free.svg).toContain('>0.0123 mm</text>');
  });

  it('text width grows with the characters and escapes nothing away', () => {
    expect(textWidth('worst deviation')).toBeGreaterThan(textWidth('knot'));
    expect(textWidth('Bézier')).toBe(textWidth('Bezier'));
  });

  it('the legend row ends where its last name ends', () => {
    const row = legendRow([{ name: 'arc', swatch: '' }, { name: 'kept as it was', swatch: '' }], 10, 20, '#000');
    expect(row.right).toBe(10 + 22 + textWidth('arc') + 12 + 22 + textWidth('kept as it was'));
    expect(row.svg).toContain('>kept as it was</text>');
  });
});
