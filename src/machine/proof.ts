/**
 * The proof on the written machine file: each element's original geometry,
 * mapped into machine coordinates, against what an independent reader rebuilt
 * from the file (./readback.ts), with the report's own sampler and two-sided
 * distance bound (../measure/sample.ts, ../measure/measure.ts). Every distance is
 * an upper bound of the true one (as for SVG output).
 */
import type { Matrix } from '../svg/matrixTypes.js';
import { applyX, applyY, multiply } from '../svg/matrix.js';
import type { Deviation } from '../report/types.js';
import { SampleBuffer, samplePath } from '../measure/sample.js';
import { compareSampled } from '../measure/measure.js';
import { keyName, machineKey, type MachineElement } from './drawing.js';
import type { ReadBack } from './readback.js';

/** Chord error and distance resolution as a fraction of the tolerance (as the SVG measurement). */
export const PROOF_ERROR_FRACTION = 1 / 1000;
/** Longest chord as a multiple of the tolerance. */
export const PROOF_SPACING_FACTOR = 2;

/** The verdict on one element. */
export interface MachineElementProof {
  index: number;
  /** The copy (1, 2, …) this verdict is on, absent for the element where it stands. */
  copy?: number;
  label: string;
  /** Null when the reader found nothing drawn for an element that draws something (or the reverse). */
  deviation: Deviation | null;
  /** Measured within the tolerance. */
  ok: boolean;
}

/** The verdict on a file. */
export interface MachineProof {
  elements: MachineElementProof[];
  /** mm, largest deviation over all elements (0 when none). */
  maxDeviation: number;
  /** Every element within the tolerance, nothing drawn outside an element, arc radii within 0.002 mm. */
  ok: boolean;
  /** One line per problem. */
  problems: string[];
}

/** NIST RS274NGC v3 §3.5.3.2: start and end radius of an arc may differ by at most this (mm). */
export const RADIUS_CHECK_MM = 0.002;

/**
 * Measure every element of a drawing against its read-back. Distances are
 * measured in machine coordinates; `worstMm` is given back on the page (root
 * viewport, y down) and `worstUser` in the element's user units, as in an SVG
 * report (the page ↔ machine flip is its own inverse).
 * @param pageToMachine page mm → machine mm (./drawing.ts)
 * @param tolMm the file's tolerance, mm (sampling and resolution; an element's own `toleranceMm` may be tighter)
 */
export function proveMachine(elements: readonly MachineElement[], read: ReadBack, pageToMachine: Matrix, tolMm: number): MachineProof {
  const out: MachineProof = { elements: [], maxDeviation: 0, ok: true, problems: [] };
  const chord = tolMm * PROOF_ERROR_FRACTION, spacing = tolMm * PROOF_SPACING_FACTOR;
  const buf = new SampleBuffer();
  for (const el of elements) {
    const tol = Math.min(tolMm, el.toleranceMm ?? tolMm);
    const toMachine = multiply(new Float64Array(6), pageToMachine, el.original.toMm);
    let sa = samplePath(el.original.path, toMachine, spacing, chord, el.also ? undefined : buf);
    // A planned group is measured as a whole: the union of its members' originals.
    for (const o of el.also ?? []) {
      const s = samplePath(o.path, multiply(new Float64Array(6), pageToMachine, o.toMm), spacing, chord);
      sa = { polylines: sa.polylines.concat(s.polylines), errorBound: Math.max(sa.errorBound, s.errorBound) };
    }
    const rb = read.elements.get(machineKey(el.index, el.copy));
    const sb = { polylines: rb ? rb.polylines : [], errorBound: read.errorBound };
    const d = sa.polylines.length === 0 && sb.polylines.length === 0 ? null : compareSampled(sa, sb, toMachine, chord);
    // The report locates the worst spot on the page (y down), as for SVG output: the flip is its own inverse.
    if (d) d.worstMm = [applyX(pageToMachine, d.worstMm[0], d.worstMm[1]), applyY(pageToMachine, d.worstMm[0], d.worstMm[1])];
    const drawsNothing = sa.polylines.length === 0 && sb.polylines.length === 0;
    const ok = drawsNothing || (d !== null && d.max <= tol);
    out.elements.push({ index: el.index, ...(el.copy ? { copy: el.copy } : {}), label: el.label, deviation: d, ok });
    if (d && d.max > out.maxDeviation) out.maxDeviation = d.max;
    if (!ok) {
      out.ok = false;
      out.problems.push(d
        ? `${el.label}: measured deviation ${d.max.toPrecision(3)} mm of the written file is over the tolerance ${+tol.toPrecision(6)} mm`
        : `${el.label}: the reader found ${sb.polylines.length === 0 ? 'nothing drawn' : 'moves where the original draws nothing'}`);
    }
  }
  const stray = read.elements.get(-1);
  if (stray && stray.polylines.length > 0) {
    out.ok = false;
    out.problems.push(`${stray.polylines.length} work moves outside any element`);
  }
  for (const k of read.elements.keys()) {
    if (k >= 0 && !elements.some((e) => machineKey(e.index, e.copy) === k)) {
      out.ok = false;
      out.problems.push(`the reader found moves for ${keyName(k)}, which the drawing does not have`);
    }
  }
  if (read.radiusMismatch > RADIUS_CHECK_MM) {
    out.ok = false;
    out.problems.push(`an arc's start and end radius differ by ${read.radiusMismatch.toPrecision(3)} mm (an interpreter refuses more than ${RADIUS_CHECK_MM} mm)`);
  }
  return out;
}
