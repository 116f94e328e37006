/** Style resolution for the drawing model (element's own attributes for now). */
import { describe, expect, it } from 'vitest';
import { resolveStyle } from '../../src/model/style.js';
import { matrix } from '../../src/svg/matrix.js';

const PX = 25.4 / 96; // CSS Values 3 §5.2: 1px = 1/96 in

describe('resolveStyle', () => {
  it('reads the presentation attributes; a style declaration wins over them (SVG 2 §6.7: presentation attributes come first in the cascade)', () => {
    const s = resolveStyle({ stroke: 'blue', fill: 'none', 'stroke-width': '2', style: 'stroke: #f00 ; fill:none' }, {}, matrix(PX, 0, 0, PX, 0, 0), 100, 100);
    expect(s).toEqual({ stroke: '#f00', fill: 'none', strokeWidthMm: 2 * PX });
  });

  it('gives the stroke width in mm on the machine, the element scale applied', () => {
    // 1mm = 96/25.4 user units at CSS px, and back: exactly 1 mm (CSS Values 3 §5.2).
    expect(resolveStyle({ 'stroke-width': '1mm' }, {}, matrix(PX, 0, 0, PX, 0, 0), 100, 100).strokeWidthMm).toBeCloseTo(1, 12);
    // Under scale(2) in mm units: 0.5 → 1 mm.
    expect(resolveStyle({ style: 'stroke-width:0.5' }, {}, matrix(2, 0, 0, 2, 0, 0), 100, 100).strokeWidthMm).toBe(1);
  });

  it('takes what the element does not set from its ancestors (stroke, fill, stroke-width inherit: SVG 2 §13.2, §13.5)', () => {
    const s = resolveStyle({ fill: 'red', stroke: 'inherit' }, { stroke: '#00f', fill: 'none', 'stroke-width': '0.5' }, matrix(2, 0, 0, 2, 0, 0), 100, 100);
    expect(s).toEqual({ stroke: '#00f', fill: 'red', strokeWidthMm: 1 });
  });

  it('says null for what is not set or not a length', () => {
    expect(resolveStyle({}, {}, matrix(1, 0, 0, 1, 0, 0), 100, 100)).toEqual({ stroke: null, fill: null, strokeWidthMm: null });
    expect(resolveStyle({ 'stroke-width': 'thick' }, {}, matrix(1, 0, 0, 1, 0, 0), 100, 100).strokeWidthMm).toBeNull();
  });
});
