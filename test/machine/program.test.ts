/**
 * The proof on the written file, for every bundled sample and for seeded
 * generated drawings: the G-code read back by gcode-toolpath (npm) and the DXF
 * read back by dxf-parser (npm) stay within the tolerance of the original
 * drawing in machine coordinates; and the proof fails when the file is wrong.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { svgMachineJob } from './fromSvg.js';
import { straightEstimate, straightProgram, writeMachineFile } from '../../src/machine/program.js';
import { BUILTIN_PROFILES } from '../../src/machine/profile.js';
import { readBackGcode } from '../../src/machine/readback.js';
import { proveMachine } from '../../src/machine/proof.js';
import { pageToMachine } from '../../src/machine/drawing.js';
import { rng } from '../rng.js';

const SAMPLES = ['bracket.svg', 'coaster.svg', 'gear.svg', 'icons/heart.svg', 'icons/tag.svg', 'icons/target.svg', 'icons/wave.svg'];
const sample = (f: string): string => readFileSync(new URL(`../../samples/${f}`, import.meta.url), 'utf8');
const TOL = 0.1;

describe('machine files of the samples, read back independently', () => {
  it.each(SAMPLES)('%s: G-code and DXF within the tolerance', (f) => {
    const job = svgMachineJob(sample(f), TOL, f);
    for (const format of ['gcode', 'dxf'] as const) {
      const out = writeMachineFile(job.drawing, { format, tolerance: TOL, profile: BUILTIN_PROFILES.laser });
      expect(out.proof.problems).toEqual([]);
      expect(out.proof.ok).toBe(true);
      expect(out.proof.maxDeviation).toBeGreaterThan(0);
      expect(out.proof.maxDeviation).toBeLessThanOrEqual(TOL);
      expect(out.moves.arcs).toBeGreaterThan(0);
      for (const e of out.proof.elements) expect(e.deviation).not.toBeNull();
    }
  });

  it('the pen profiles and the upper-left origin prove as well (coaster)', () => {
    const job = svgMachineJob(sample('coaster.svg'), TOL, 'coaster.svg');
    for (const profile of [BUILTIN_PROFILES['pen-z'], BUILTIN_PROFILES['pen-servo']]) {
      for (const origin of ['lower-left', 'upper-left'] as const) {
        const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: TOL, profile, origin });
        expect(out.proof.problems).toEqual([]);
        expect(out.text).toContain(profile.toolOn[0].replace('{power}', String(profile.power)));
      }
    }
  });

  it('the header states tolerance, measured deviation and source', () => {
    const job = svgMachineJob(sample('bracket.svg'), TOL, 'bracket.svg');
    const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: TOL, profile: BUILTIN_PROFILES.laser });
    const dev = +out.proof.maxDeviation.toPrecision(3);
    expect(out.text).toContain(`(tolerance 0.1 mm, measured deviation ${dev} mm`);
    expect(out.text).toContain('(source bracket.svg)');
  });

  it('the traced coaster needs at least 5× fewer G-code lines than as straight moves through its vertices', () => {
    const job = svgMachineJob(sample('coaster.svg'), TOL);
    const arcs = writeMachineFile(job.drawing, { format: 'gcode', tolerance: TOL, profile: BUILTIN_PROFILES.laser });
    const straight = straightProgram(job.dense, job.drawing.pageHeightMm, BUILTIN_PROFILES.laser, arcs.digits);
    expect(straight.lines / arcs.lines).toBeGreaterThanOrEqual(5);
    // The estimate without the text is the same program's.
    const est = straightEstimate(job.dense, job.drawing.pageHeightMm, BUILTIN_PROFILES.laser);
    expect(est.time.seconds).toBe(straight.time.seconds);
    expect(est.moves).toBe(straight.moves + straight.skipped);
  });
});

/** A seeded drawing of our own: random arcs (both sweep flags, large and small) and polylines. */
function generated(seed: number): string {
  const r = rng(seed);
  const paths: string[] = [];
  for (let k = 0; k < 6; k++) {
    let x = 20 + r() * 60, y = 20 + r() * 60;
    let d = `M ${x.toFixed(3)} ${y.toFixed(3)}`;
    for (let j = 0; j < 4; j++) {
      const nx = 10 + r() * 80, ny = 10 + r() * 80, rad = 5 + r() * 60;
      if (r() < 0.7) d += ` A ${rad.toFixed(3)} ${rad.toFixed(3)} 0 ${r() < 0.3 ? 1 : 0} ${r() < 0.5 ? 1 : 0} ${nx.toFixed(3)} ${ny.toFixed(3)}`;
      else d += ` L ${nx.toFixed(3)} ${ny.toFixed(3)}`;
      x = nx;
      y = ny;
    }
    if (r() < 0.4) d += ' Z';
    paths.push(`<path d="${d}" fill="none" stroke="${r() < 0.5 ? '#ff0000' : '#000000'}"/>`);
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${paths.join('')}</svg>`;
}

describe('generated drawings', () => {
  it.each([1, 2, 3, 4, 5])('seed %i: G-code and DXF within the tolerance at 0.1 and 0.01 mm', (seed) => {
    for (const tol of [0.1, 0.01]) {
      const job = svgMachineJob(generated(seed), tol);
      for (const format of ['gcode', 'dxf'] as const) {
        const out = writeMachineFile(job.drawing, { format, tolerance: tol, profile: BUILTIN_PROFILES.laser });
        expect(out.proof.problems, `${format} at ${tol}`).toEqual([]);
      }
    }
  });
});

describe('the proof can fail', () => {
  const job = svgMachineJob(sample('bracket.svg'), TOL);
  const out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: TOL, profile: BUILTIN_PROFILES.laser });
  const frame = pageToMachine(job.drawing.pageHeightMm, 'lower-left');
  const check = (text: string) => proveMachine(job.drawing.elements, readBackGcode(text, TOL / 1000, 2 * TOL), frame, TOL);

  it('G2 and G3 swapped: the arcs go the long way round', () => {
    const p = check(out.text.replace(/^G2 /gm, 'G9 ').replace(/^G3 /gm, 'G2 ').replace(/^G9 /gm, 'G3 '));
    expect(p.ok).toBe(false);
    expect(p.problems.join('\n')).toMatch(/over the tolerance/);
  });

  it('one end point moved by 0.2 mm', () => {
    const p = check(out.text.replace(/^(G1 X[\d.]+ Y)([\d.]+)/m, (_m, a: string, y: string) => `${a}${(Number(y) + 0.2).toFixed(3)}`));
    expect(p.ok).toBe(false);
  });

  it('an I word off by 0.01 mm fails the 0.002 mm radius check', () => {
    const p = check(out.text.replace(/^(G[23] .* I)(-?[\d.]+)/m, (_m, a: string, i: string) => `${a}${(Number(i) + 0.01).toFixed(3)}`));
    expect(p.problems.join('\n')).toMatch(/radius differ by/);
  });

  it('an element with its work moves left out', () => {
    const p = check(out.text.replace(/^\(element 4 .*\)\n(?:(?!\(element).*\n)*/m, ''));
    expect(p.problems.join('\n')).toMatch(/circle#hole-left: the reader found nothing drawn/);
  });
});
