/**
 * Test and benchmark adapter: an SVG file → a fitted machine drawing, the way
 * the pipeline reads and fits (read, flatten within 5 % of the tolerance, fit
 * within the rest less the machine rounding share). Stand-in for the pipeline's
 * drawing model; the page height is the drawing's lowest point and the group is
 * the element's own stroke attribute (no cascade), which is all these tests need.
 */
import { readSvg } from '../../src/svg/document.js';
import { parsePathData } from '../../src/svg/pathData.js';
import { shapeToPath } from '../../src/svg/shapes.js';
import { flattenPath } from '../../src/geom/flatten.js';
import { fitPolyline } from '../../src/fit/fitPolyline.js';
import { thinWithin } from '../../src/fit/prefilter.js';
import { OP_A, OP_C, OP_Q, type PathData } from '../../src/svg/pathTypes.js';
import type { MachineDrawing, MachineElement } from '../../src/machine/drawing.js';
import type { PagePolyline } from '../../src/machine/emit.js';
import { machineDigits, machineSplit } from '../../src/machine/digits.js';
import { strokeKey } from '../../src/machine/colour.js';

export interface SvgMachineJob {
  drawing: MachineDrawing;
  digits: number;
  /** Per element: the input polylines (every vertex) and the fewest straight moves within the tolerance. */
  dense: { index: number; label: string; group: string; polylines: PagePolyline[] }[];
  thinned: { index: number; label: string; group: string; polylines: PagePolyline[] }[];
}

function curved(p: PathData): boolean {
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] === OP_C || p.ops[i] === OP_Q || p.ops[i] === OP_A) return true;
  return false;
}

export function svgMachineJob(text: string, tol: number, source: string | null = null): SvgMachineJob {
  const doc = readSvg(text, { assumedMmPerUnit: 25.4 / 96 });
  const digits = machineDigits(tol);
  const elements: MachineElement[] = [];
  const dense: SvgMachineJob['dense'] = [], thinned: SvgMachineJob['thinned'] = [];
  let bottom = 0;
  for (const el of doc.elements) {
    if (!el.rewritable) continue;
    const p = el.name === 'path' ? parsePathData(el.attrs.d ?? '') : shapeToPath(el.name, (a) => el.attrs[a], el.viewportW, el.viewportH).path;
    if (!p || p.ops.length === 0) continue;
    const split = machineSplit(tol, curved(p), digits);
    const contours = flattenPath(p, el.toMm, curved(p) ? split.flattenMm : tol);
    const fitTol = split.fitMm;
    const label = el.id ? `${el.name}#${el.id}` : `${el.name} ${el.index}`;
    const group = strokeKey(el.attrs.stroke ?? null);
    const fitted = contours.map((c) => ({ segments: fitPolyline(c.xy, { tolerance: fitTol, closed: c.closed, corners: c.corners }).segments, closed: c.closed }));
    elements.push({ index: el.index, label, group, contours: fitted, original: { path: p, toMm: el.toMm } });
    dense.push({ index: el.index, label, group, polylines: contours.map((c) => ({ xy: c.xy, closed: c.closed })) });
    thinned.push({
      index: el.index, label, group, polylines: contours.map((c) => {
        const n = c.xy.length >> 1;
        const keep = thinWithin(c.xy, n, c.closed, tol, null);
        const xy = new Float64Array(2 * keep.length);
        keep.forEach((v, k) => {
          xy[2 * k] = c.xy[2 * (v % n)];
          xy[2 * k + 1] = c.xy[2 * (v % n) + 1];
        });
        return { xy, closed: false };
      }),
    });
    for (const c of contours) for (let i = 1; i < c.xy.length; i += 2) bottom = Math.max(bottom, c.xy[i]);
  }
  return { drawing: { pageHeightMm: Math.ceil(bottom - 1e-9), elements, source }, digits, dense, thinned };
}
