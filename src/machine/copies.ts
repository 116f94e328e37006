/**
 * Copies drawn by `<use>` in a machine file: a machine file has no references,
 * so every copy is written as geometry of its own. Each copy's contours are the
 * element's flattened contours (mm) mapped by the copy's map (../model/drawing.ts
 * DrawingCopy), fitted anew where they land (a copy through a skew or an unequal
 * scale would turn a fitted arc into an ellipse), grouped by the copy's own
 * computed stroke, and proven on their own against the element's original path
 * through the copy's matrix.
 *
 * Budget: the element was flattened within its share of the file's tolerance
 * over its largest copy (src/svg/reuse.ts copyScale), so a copy that maps by at
 * most s keeps its flattening within s·flattenMm; the fit gets the rest of the
 * file's tolerance after that and the written rounding.
 */
import type { DrawingElement } from '../model/drawing.js';
import type { ElementCopy } from '../svg/documentTypes.js';
import type { PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';
import { invert, maxScale, multiply } from '../svg/matrix.js';
import { fitPolyline } from '../fit/fitPolyline.js';
import { arcGeometry } from '../fit/segment.js';
import type { MachineContour, MachineElement } from './drawing.js';
import { strokeKey } from './colour.js';

/** One copy, ready to write: its machine element, where its `<use>` stands, and its fallback as straight moves. */
export interface MachineCopy {
  element: MachineElement;
  /** Document index of the `<use>` that draws it: the copy is written there, in painting order. */
  use: number;
  /** The mapped polylines, written as straight moves when the fit measures over the tolerance. */
  straight: MachineContour[];
  segments: { arcs: number; lines: number };
  /** The copy's drawing reaches outside a viewport that clips it in SVG (the machine file draws it whole). */
  clipped: boolean;
}

/**
 * The copies of one element as machine elements.
 * @param copies the source element's copies (src/svg), in the order of `model.copies`
 * @param path its original path data (user units), for the proof
 * @param rootToMm root user units → mm (for the copies' clip rectangles)
 * @param tolMm the file's tolerance, mm
 */
export function machineCopies(
  model: DrawingElement, copies: readonly ElementCopy[], path: PathData, label: string, rootToMm: Matrix, tolMm: number, cornerAngle: number,
): MachineCopy[] {
  return model.copies.map((c, k) => {
    const s = maxScale(c.map);
    const fitMm = Math.max(tolMm - s * model.budget.flattenMm - model.budget.roundMm, 0.05 * tolMm);
    const mapped = model.contours.map((ct) => ({ xy: mapXy(c.map, ct.xy), closed: ct.closed, corners: ct.corners }));
    let arcs = 0, lines = 0;
    const contours = mapped.map((ct) => {
      const segments = fitPolyline(ct.xy, { tolerance: fitMm, closed: ct.closed, cornerAngle, corners: ct.corners }).segments;
      for (const g of segments) if (arcGeometry(g)) arcs++; else lines++;
      return { segments, closed: ct.closed };
    });
    const src = copies[k];
    return {
      element: {
        index: model.index, copy: k + 1, label: `${label} copy ${k + 1}`, group: strokeKey(c.style.stroke), toleranceMm: tolMm,
        contours, original: { path, toMm: src.toMm },
      },
      use: src.use,
      straight: mapped.map((ct) => ({ segments: [], closed: ct.closed, xy: ct.xy })),
      segments: { arcs, lines },
      clipped: src.clips.some((r) => outside(r.rect, multiply(new Float64Array(6), rootToMm, r.toRoot), mapped) > tolMm),
    };
  });
}

function mapXy(m: Matrix, xy: Float64Array): Float64Array {
  const out = new Float64Array(xy.length);
  for (let i = 0; i < xy.length; i += 2) {
    out[i] = m[0] * xy[i] + m[2] * xy[i + 1] + m[4];
    out[i + 1] = m[1] * xy[i] + m[3] * xy[i + 1] + m[5];
  }
  return out;
}

/** How far (mm, an upper bound) the polylines reach outside the rectangle `[x y w h]` that `toMm` places on the page. */
function outside(rect: readonly number[], toMm: Matrix, polys: readonly { xy: Float64Array }[]): number {
  const back = invert(new Float64Array(6), toMm);
  if (!back) return Infinity;
  const [x0, y0, w, h] = rect, s = maxScale(toMm);
  let worst = 0;
  for (const p of polys) {
    for (let i = 0; i < p.xy.length; i += 2) {
      const u = back[0] * p.xy[i] + back[2] * p.xy[i + 1] + back[4], v = back[1] * p.xy[i] + back[3] * p.xy[i + 1] + back[5];
      worst = Math.max(worst, s * Math.max(x0 - u, u - (x0 + w), y0 - v, v - (y0 + h), 0));
    }
  }
  return worst;
}
