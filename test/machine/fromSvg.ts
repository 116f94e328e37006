/**
 * Test and benchmark helper: an SVG file → the machine writers' input, built
 * from the pipeline's own pieces (readSvg, the drawing model, the budget split
 * for mm output, fitElement), as src/refitMachine.ts does, plus the input as
 * polylines for the straight-move baselines (every vertex, and the fewest
 * vertices within the tolerance).
 */
import { readSvg } from '../../src/svg/document.js';
import { drawingElementFromSvg, readGeometry } from '../../src/model/fromSvg.js';
import { fitElement } from '../../src/model/fit.js';
import { thinWithin } from '../../src/fit/prefilter.js';
import type { MachineDrawing, MachineElement } from '../../src/machine/drawing.js';
import type { PagePolyline } from '../../src/machine/emit.js';
import { machineDigits } from '../../src/machine/digits.js';
import { strokeKey } from '../../src/machine/colour.js';

export interface SvgMachineJob {
  drawing: MachineDrawing;
  digits: number;
  /** Per element: the input polylines (every vertex) and the fewest straight moves within the tolerance. */
  dense: { index: number; label: string; group: string; polylines: PagePolyline[] }[];
  thinned: { index: number; label: string; group: string; polylines: PagePolyline[] }[];
}

export function svgMachineJob(text: string, tol: number, source: string | null = null): SvgMachineJob {
  const doc = readSvg(text, { assumedMmPerUnit: 25.4 / 96 });
  const digits = machineDigits(tol);
  const elements: MachineElement[] = [];
  const dense: SvgMachineJob['dense'] = [], thinned: SvgMachineJob['thinned'] = [];
  for (const el of doc.elements) {
    if (!el.rewritable) continue;
    const p = readGeometry(el, []);
    if (!p || p.ops.length === 0) continue;
    const model = drawingElementFromSvg(el, p, tol, 1, digits);
    if (!('contours' in model)) throw new Error(`${el.name} ${el.index}: ${model.message}`);
    const fitted = fitElement(model, 30);
    const label = el.id ? `${el.name}#${el.id}` : el.name;
    const group = strokeKey(model.style.stroke);
    elements.push({ index: el.index, label, group, contours: fitted.contours.map((c) => ({ segments: c.segments, closed: c.contour.closed })), original: { path: p, toMm: el.toMm } });
    dense.push({ index: el.index, label, group, polylines: model.contours.map((c) => ({ xy: c.xy, closed: c.closed })) });
    thinned.push({
      index: el.index, label, group, polylines: model.contours.map((c) => {
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
  }
  return { drawing: { pageHeightMm: doc.pageMm[1], elements, source }, digits, dense, thinned };
}
