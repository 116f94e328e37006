/**
 * Nesting: which closed contour directly contains each contour, for a cutting
 * order that does every contour inside a closed one before that one (holes before
 * the part around them, so a part cut free does not shift while its holes are cut:
 * precedence constraints on the order, as in the ordering literature's treatment of
 * nested contours, from memory).
 *
 * Method [derived]: closed contours by |area| (shoelace formula); the parent of a
 * contour is the smallest closed contour of larger area whose winding number about
 * the contour's first vertex is not zero (a signed crossing count, the nonzero
 * rule; for a simple contour any inside point has winding ±1). An R-tree of the
 * closed contours' boxes (flatbush) finds the candidates. Contours that cross each
 * other get whichever parent their first vertex says.
 */
import Flatbush from 'flatbush';
import { signedArea } from '../geom/area.js';

/** A contour, mm (stride 2). */
export interface NestInput {
  xy: Float64Array;
  closed: boolean;
}

/** Winding number of a closed polyline about (px, py) (signed upward/downward crossings of the ray to +x). */
export function windingNumber(xy: Float64Array, px: number, py: number): number {
  const n = xy.length >> 1;
  let w = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const x0 = xy[2 * j], y0 = xy[2 * j + 1], x1 = xy[2 * i], y1 = xy[2 * i + 1];
    const side = (x1 - x0) * (py - y0) - (px - x0) * (y1 - y0);
    if (y0 <= py) {
      if (y1 > py && side > 0) w++;
    } else if (y1 <= py && side < 0) w--;
  }
  return w;
}

/**
 * The parent of each contour: the index of the smallest closed contour around it, or -1.
 * Open contours get parents too (an engraving inside a part is done before the part is cut out).
 */
export function nestingParents(contours: readonly NestInput[]): Int32Array {
  const n = contours.length;
  const parent = new Int32Array(n).fill(-1);
  const closed: number[] = [];
  for (let i = 0; i < n; i++) if (contours[i].closed && contours[i].xy.length >= 6) closed.push(i);
  if (closed.length === 0) return parent;
  const area = new Float64Array(n);
  for (const i of closed) area[i] = Math.abs(signedArea(contours[i].xy));
  const index = new Flatbush(closed.length);
  for (const i of closed) {
    const xy = contours[i].xy;
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
    for (let k = 0; k < xy.length; k += 2) {
      x0 = Math.min(x0, xy[k]);
      y0 = Math.min(y0, xy[k + 1]);
      x1 = Math.max(x1, xy[k]);
      y1 = Math.max(y1, xy[k + 1]);
    }
    index.add(x0, y0, x1, y1);
  }
  index.finish();
  for (let i = 0; i < n; i++) {
    const xy = contours[i].xy;
    if (xy.length < 2) continue;
    const own = contours[i].closed ? area[i] : -1;
    const px = xy[0], py = xy[1];
    let best = -1;
    for (const h of index.search(px, py, px, py)) {
      const c = closed[h];
      if (c === i || !(area[c] > own)) continue;
      if (best >= 0 && area[c] >= area[best]) continue;
      if (windingNumber(contours[c].xy, px, py) !== 0) best = c;
    }
    parent[i] = best;
  }
  return parent;
}
