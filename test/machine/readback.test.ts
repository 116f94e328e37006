/**
 * The read-back's own sampling: arcs sampled from centre, start and end stay
 * within the stated chord error (linear-interpolation bound h²·max|p''|/8,
 * common practice), including the slight spiral an interpreter accepts; and
 * the element comments route moves to their elements.
 */
import { describe, expect, it } from 'vitest';
import { arcPoints, readBackGcode } from '../../src/machine/readback.js';
import { keyName, machineKey } from '../../src/machine/drawing.js';

/** Largest distance from chord midpoints to the curve r(θ) = r0 + (r1 − r0)·t about c. */
function worstChord(pts: Float64Array, cx: number, cy: number, r0: number, r1: number, a0: number, sweep: number): number {
  let worst = 0;
  const n = pts.length / 2 - 1;
  for (let i = 0; i < n; i++) {
    const mx = (pts[2 * i] + pts[2 * i + 2]) / 2, my = (pts[2 * i + 1] + pts[2 * i + 3]) / 2;
    // Dense reference samples of the true curve over this chord's parameter interval.
    let best = Infinity;
    for (let k = 0; k <= 200; k++) {
      const t = (i + k / 200) / n, a = a0 + sweep * t, r = r0 + (r1 - r0) * t;
      best = Math.min(best, Math.hypot(cx + r * Math.cos(a) - mx, cy + r * Math.sin(a) - my));
    }
    worst = Math.max(worst, best);
  }
  return worst;
}

describe('read-back sampling', () => {
  it('a circle arc: every chord within the chord error, ends exact', () => {
    const pts = arcPoints(10, 0, 0, 10, 0, 0, Math.PI / 2, 0.001, 100);
    expect(worstChord(pts, 0, 0, 10, 10, 0, Math.PI / 2)).toBeLessThanOrEqual(0.001);
    expect([pts[0], pts[1], pts[pts.length - 2], pts[pts.length - 1]]).toEqual([10, 0, 0, 10]);
  });
  it('a spiral from r = 10 to 10.002 clockwise over 300°', () => {
    const s = (-300 * Math.PI) / 180;
    const pts = arcPoints(10, 0, 10.002 * Math.cos(s), 10.002 * Math.sin(s), 0, 0, s, 0.0005, 100);
    expect(worstChord(pts, 0, 0, 10, 10.002, 0, s)).toBeLessThanOrEqual(0.0005);
  });
  it('a full turn when the end is the start (NIST §3.5.3.2), and moves go to the element named before them', () => {
    const rb = readBackGcode('G21 G90 G17\nG0 X5 Y0\n(element 7 circle)\nG3 X5 Y0 I-5 J0 F100\n(element 9 path)\nG1 X6 Y0\nG0 X0 Y0\n', 0.001, 1);
    expect([...rb.elements.keys()]).toEqual([7, 9]);
    const circle = rb.elements.get(7)!.polylines[0];
    let minX = Infinity;
    for (let i = 0; i < circle.length; i += 2) minX = Math.min(minX, circle[i]);
    expect(minX).toBeCloseTo(-5, 3);
    expect(rb.moves).toBe(2);
  });
  it('a copy\'s comment routes its moves to the copy, apart from the element where it stands', () => {
    const rb = readBackGcode('G21 G90 G17\nG0 X0 Y0\n(element 4 path#a)\nG1 X1 Y0 F100\n(element 4 copy 2 path#a copy 2)\nG1 X2 Y0\n', 0.001, 1);
    expect([...rb.elements.keys()]).toEqual([machineKey(4), machineKey(4, 2)]);
    expect([keyName(machineKey(4)), keyName(machineKey(4, 2)), keyName(machineKey(4, 4095))]).toEqual(['element 4', 'element 4 copy 2', 'element 4 copy 4095']);
    expect(() => machineKey(4, 0)).toThrow(/copy must be an integer.*got 0/);
  });
});
