import { describe, expect, it } from 'vitest';
import { shapeToPath, type ShapeName } from '../../src/svg/shapes.js';
import { parsePathData, pathDataToString } from '../../src/svg/pathData.js';

function attrs(a: Record<string, string>): (k: string) => string | undefined {
  return (k) => (Object.prototype.hasOwnProperty.call(a, k) ? a[k] : undefined);
}
function shape(name: ShapeName, a: Record<string, string>, vw = 1000, vh = 1000) {
  return shapeToPath(name, attrs(a), vw, vh);
}
/** The shape's path, serialised, compared with the expected path text (parsed the same way). */
function expectPath(name: ShapeName, a: Record<string, string>, expected: string, vw = 1000, vh = 1000): void {
  const r = shape(name, a, vw, vh);
  expect(r.path, JSON.stringify(a)).not.toBeNull();
  const want = parsePathData(expected);
  expect(want.error).toBeNull();
  expect(pathDataToString(r.path!)).toBe(pathDataToString(want));
}

describe('rect (S2 §10.2, REFERENCES.md §3)', () => {
  it('R1 rounded rect path', () => {
    // W3C SVG 2 §10.2 (R1)
    expectPath('rect', { x: '0', y: '0', width: '100', height: '50', rx: '10' },
      'M10 0 H90 A10 10 0 0 1 100 10 V40 A10 10 0 0 1 90 50 H10 A10 10 0 0 1 0 40 V10 A10 10 0 0 1 10 0 Z');
    expect(shape('rect', { width: '100', height: '50', rx: '10' }).error).toBeNull();
  });
  it('R2 rx=80 → clamped rx=50, ry=25, zero-length H kept', () => {
    // W3C SVG 2 §10.2 (R2)
    expectPath('rect', { width: '100', height: '50', rx: '80' },
      'M50 0 H50 A50 25 0 0 1 100 25 V25 A50 25 0 0 1 50 50 H50 A50 25 0 0 1 0 25 V25 A50 25 0 0 1 50 0 Z');
  });
  it('R3 copy before clamp: width 40, height 100, rx 30 → (20, 30)', () => {
    // W3C SVG 2 §10.2 (R3)
    const p = shape('rect', { width: '40', height: '100', rx: '30' }).path!;
    expect(Array.from(p.args.subarray(4, 6))).toEqual([20, 30]);
  });
  it('R4 negative rx ignored → auto → copies ry = 10', () => {
    // W3C SVG 2 §10.2 (R4)
    const r = shape('rect', { width: '100', height: '50', rx: '-5', ry: '10' });
    expect(Array.from(r.path!.args.subarray(4, 6))).toEqual([10, 10]);
    expect(r.error).toMatch(/rx="-5" is negative/);
  });
  it('R5 rx=0 ry=10 → square corners', () => {
    // W3C SVG 2 §10.2, SVG 1.1 §9.2 (R5)
    expectPath('rect', { x: '1', y: '2', width: '10', height: '20', rx: '0', ry: '10' }, 'M1 2 H11 V22 H1 V2 Z');
    expectPath('rect', { width: '10', height: '20' }, 'M0 0 H10 V20 H0 V0 Z');
  });
  it('R6 width=-1, width=0 or missing → not rendered', () => {
    // W3C SVG 2 §10.2 (R6)
    const cases: Record<string, string>[] = [{ width: '-1', height: '5' }, { width: '0', height: '5' }, { height: '5' }, { width: '5', height: '0' }];
    for (const a of cases) {
      const r = shape('rect', a);
      expect(r.path, JSON.stringify(a)).toBeNull();
      expect(r.error).toMatch(/not rendered/);
    }
  });
  it('percentages: x, width, rx of the viewport width; y, height, ry of its height', () => {
    // W3C SVG 2 geometry properties (rx percentages refer to the viewport width)
    expectPath('rect', { x: '10%', y: '10%', width: '50%', height: '50%' }, 'M20 10 H120 V60 H20 V10 Z', 200, 100);
    const p = shape('rect', { width: '100', height: '100', rx: '5%' }, 200, 100).path!;
    expect(Array.from(p.args.subarray(4, 6))).toEqual([10, 10]);
  });
});

describe('circle and ellipse (S2 §10.3–10.4)', () => {
  it('C1 four arcs from 3 o\'clock, sweep 1', () => {
    // W3C SVG 2 §10.3 (C1)
    expectPath('circle', { cx: '50', cy: '50', r: '10' },
      'M60 50 A10 10 0 0 1 50 60 A10 10 0 0 1 40 50 A10 10 0 0 1 50 40 A10 10 0 0 1 60 50 Z');
  });
  it('C2 r=0, r=-1 or missing → not rendered', () => {
    // W3C SVG 2 §10.3 (C2)
    const cases: Record<string, string>[] = [{ r: '0' }, { r: '-1' }, {}, { r: 'big' }];
    for (const a of cases) expect(shape('circle', a).path, JSON.stringify(a)).toBeNull();
  });
  it('U1 r="1%" in a 4000×2000 viewport → r = 31.6228', () => {
    // W3C SVG 2 §8.9 #Units example (U1)
    const p = shape('circle', { r: '1%' }, 4000, 2000).path!;
    expect(p.args[0]).toBeCloseTo(31.6228, 4);
    expect(p.args[2]).toBeCloseTo(31.6228, 4);
  });
  it('E1 ellipse rx=20 alone → circle r=20 at the origin (SVG 2 auto)', () => {
    // W3C SVG 2 §10.4 (E1)
    expectPath('ellipse', { rx: '20' },
      'M20 0 A20 20 0 0 1 0 20 A20 20 0 0 1 -20 0 A20 20 0 0 1 0 -20 A20 20 0 0 1 20 0 Z');
  });
  it('ellipse with both radii, both auto, a zero radius', () => {
    expectPath('ellipse', { cx: '5', cy: '5', rx: '4', ry: '2' },
      'M9 5 A4 2 0 0 1 5 7 A4 2 0 0 1 1 5 A4 2 0 0 1 5 3 A4 2 0 0 1 9 5 Z');
    expect(shape('ellipse', {}).path).toBeNull();
    expect(shape('ellipse', { rx: 'auto', ry: 'auto' }).path).toBeNull();
    expect(shape('ellipse', { rx: '0', ry: '5' }).path).toBeNull();
  });
  it('lengths with units become user units', () => {
    // CSS Values 3 §5.2: 1in = 96px
    const p = shape('circle', { r: '1in' }).path!;
    expect(p.args[0]).toBe(96);
  });
});

describe('line, polyline, polygon (S2 §10.5–10.7)', () => {
  it('L1 line x2=10 y2=10 → M0 0 L10 10', () => {
    // W3C SVG 2 §10.5 (L1)
    expectPath('line', { x2: '10', y2: '10' }, 'M0 0 L10 10');
  });
  it('PL1 odd coordinate dropped, element in error', () => {
    // W3C SVG 2 §10.6 (PL1)
    const r = shape('polyline', { points: '10,10 20,20 30' });
    expect(pathDataToString(r.path!)).toBe('M 10 10 L 20 20');
    expect(r.error).toMatch(/odd number of coordinates/);
  });
  it('PG1 polygon closes', () => {
    // W3C SVG 2 §10.7 (PG1)
    expectPath('polygon', { points: '0,0 10,0 10,10' }, 'M0 0 L10 0 L10 10 Z');
    expect(shape('polygon', { points: '0,0 10,0 10,10' }).error).toBeNull();
  });
  it('polygon with a dropped coordinate stays closed (our decision)', () => {
    const r = shape('polygon', { points: '0 0 10 0 10 10 5' });
    expect(pathDataToString(r.path!)).toBe('M 0 0 L 10 0 L 10 10 Z');
    expect(r.error).not.toBeNull();
  });
  it('points separators, junk, empty', () => {
    expectPath('polyline', { points: ' 1 2,3 4\n5,6 ' }, 'M1 2 L3 4 L5 6');
    const bad = shape('polyline', { points: '1 2 3 4 x 5 6' });
    expect(pathDataToString(bad.path!)).toBe('M 1 2 L 3 4');
    expect(bad.error).toMatch(/offset 8/);
    expect(shape('polyline', { points: '' }).path).toBeNull();
    expect(shape('polygon', {}).path).toBeNull();
  });
  it('counts are keyed by the emitted letters', () => {
    expect(shape('polygon', { points: '0,0 10,0 10,10' }).path!.counts).toEqual({ M: 1, L: 2, Z: 1 });
    expect(shape('circle', { r: '1' }).path!.counts).toEqual({ M: 1, A: 4, Z: 1 });
  });
});
