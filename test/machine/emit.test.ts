/**
 * The page → machine flip and the arc sense, derived and then checked against
 * the independent read-back (gcode-toolpath, npm).
 *
 * Derivation: the arc `M 10 0 A 10 10 0 0 1 0 10` (SVG sweep-flag 1: the
 * angle increases from +x towards +y, W3C SVG 1.1 F.6.5) has its centre at the
 * origin and passes (7.07, 7.07): clockwise on a y-down screen. Flipped to
 * y' = H − y it runs from (10, H) to (0, H − 10) about (0, H), from angle 0 to
 * −90°: clockwise seen from +Z, a G2 (NIST RS274NGC v3 §3.5.3). The upper-left
 * origin (y' = −y) is a flip too: still G2.
 */
import { describe, expect, it } from 'vitest';
import { svgMachineJob } from './fromSvg.js';
import { emitMachine } from '../../src/machine/emit.js';
import { pageToMachine } from '../../src/machine/drawing.js';
import { RecordingMachineSink } from '../../src/machine/sink.js';
import { writeMachineFile } from '../../src/machine/program.js';
import { BUILTIN_PROFILES } from '../../src/machine/profile.js';

const svg = (d: string): string => `<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 20 20"><path d="${d}" fill="none" stroke="#000"/></svg>`;

describe('page → machine', () => {
  it('the lower-left origin flips y about the page height, the upper-left one about 0', () => {
    expect(Array.from(pageToMachine(80, 'lower-left'))).toEqual([1, 0, 0, -1, 0, 80]);
    expect(Array.from(pageToMachine(80, 'upper-left'))).toEqual([1, 0, 0, -1, 0, 0]);
    expect(() => pageToMachine(NaN, 'lower-left')).toThrow(/page height.*NaN/);
  });

  it.each(['lower-left', 'upper-left'] as const)('SVG sweep-flag 1 becomes G2 (%s origin), and reads back within tolerance', (origin) => {
    const job = svgMachineJob(svg('M 10 0 A 10 10 0 0 1 0 10'), 0.05);
    const rec = new RecordingMachineSink();
    emitMachine(rec, job.drawing.elements, pageToMachine(job.drawing.pageHeightMm, origin));
    const arcs = rec.moves.filter((m) => m.kind === 'arc');
    expect(arcs.length).toBeGreaterThan(0);
    for (const a of arcs) if (a.kind === 'arc') expect(a.ccw).toBe(false);
    const h = origin === 'lower-left' ? job.drawing.pageHeightMm : 0;
    expect(rec.moves[0].kind).toBe('travel');
    expect(rec.moves[0].x).toBeCloseTo(10, 9);
    expect(rec.moves[0].y).toBeCloseTo(h, 9);
    const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: 0.05, profile: BUILTIN_PROFILES.laser, origin });
    expect(out.text).toMatch(/\nG2 X0 Y/);
    expect(out.text).not.toMatch(/\nG3 /);
    expect(out.proof.ok).toBe(true);
  });

  it('sweep-flag 0 becomes G3', () => {
    const job = svgMachineJob(svg('M 10 0 A 10 10 0 0 0 0 10'), 0.05);
    const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: 0.05, profile: BUILTIN_PROFILES.laser });
    expect(out.text).toMatch(/\nG3 /);
    expect(out.text).not.toMatch(/\nG2 /);
    expect(out.proof.ok).toBe(true);
  });

  it('a whole circle is written as two arcs', () => {
    const job = svgMachineJob(svg('M 15 10 A 5 5 0 1 1 5 10 A 5 5 0 1 1 15 10 Z'), 0.05);
    const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: 0.05, profile: BUILTIN_PROFILES.laser });
    expect(out.moves.arcs).toBe(2);
    expect(out.proof.ok).toBe(true);
  });
});

describe('contours kept as polylines', () => {
  it('a contour given as xy is written as straight moves and proves like the rest', () => {
    const job = svgMachineJob(svg('M 2 2 L 18 2 L 18 18 Z'), 0.05);
    const el = job.drawing.elements[0];
    el.contours = [{ segments: [], closed: true, xy: Float64Array.of(2, 2, 18, 2, 18, 18) }];
    const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: 0.05, profile: BUILTIN_PROFILES.laser });
    expect(out.moves).toMatchObject({ lines: 3, arcs: 0, travels: 1 });
    expect(out.proof.ok).toBe(true);
    expect(out.proof.maxDeviation).toBeLessThanOrEqual(0.05 / 200); // exact but for the bound's resolution
  });
});

describe('the worst spot is reported on the page', () => {
  it('worstMm lies on the page drawing (y down), whatever the origin', () => {
    // A quarter circle of radius 10 about (0, 0) on the page, between (10, 0) and (0, 10).
    const job = svgMachineJob(svg('M 10 0 A 10 10 0 0 1 0 10'), 0.05);
    for (const origin of ['lower-left', 'upper-left'] as const) {
      const out = writeMachineFile(job.drawing, { format: 'dxf', tolerance: 0.05, profile: BUILTIN_PROFILES.laser, origin });
      const [x, y] = out.proof.elements[0].deviation!.worstMm;
      expect(Math.abs(Math.hypot(x, y) - 10)).toBeLessThan(0.06);
      expect(y).toBeGreaterThanOrEqual(-0.06);
    }
  });
});
