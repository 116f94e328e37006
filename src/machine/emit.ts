/**
 * Replay a fitted drawing into a machine sink, in machine coordinates.
 *
 * Each point goes through the page → machine matrix (./drawing.ts). Arcs: the
 * segment's centre and signed sweep are read off its motor (arcGeometry); the
 * flip has determinant −1, so it reverses the turning sense: a page sweep > 0
 * (from +x towards +y, y down) becomes clockwise seen from +Z, a G2. Arcs of
 * more than three quarters of a turn are written as two halves, so no written
 * arc starts and ends on nearly the same point (its chord is at least √2·r; a
 * whole circle is two arcs) and no rounding can turn a nearly closed arc into
 * a full turn or a point. Consecutive arcs on the same circle (within
 * SAME_CIRCLE_MM, the same sense) are first joined into one.
 */
import { arcGeometry } from '../fit/segment.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { MachineElement } from './drawing.js';
import type { MachineSink } from './sink.js';

/** Arcs sweeping more than this (radians) are halved. */
export const SPLIT_SWEEP = 1.5 * Math.PI;
/** mm: arcs whose centres and radii agree this closely continue one circle and are written as one move. */
export const SAME_CIRCLE_MM = 1e-7;

/** What {@link emitMachine} wrote. */
export interface MachineEmitStats {
  lines: number;
  arcs: number;
  travels: number;
}

/**
 * Write every element's contours: travel to each contour's start, then its
 * segments as work moves. Does not call `finish`.
 * @param m page mm → machine mm (./drawing.ts pageToMachine)
 */
export function emitMachine(sink: MachineSink, elements: readonly MachineElement[], m: Matrix): MachineEmitStats {
  const stats: MachineEmitStats = { lines: 0, arcs: 0, travels: 0 };
  const a = m[0], b = m[1], c = m[2], d = m[3], e = m[4], f = m[5];
  const X = (x: number, y: number): number => a * x + c * y + e;
  const Y = (x: number, y: number): number => b * x + d * y + f;
  const mirror = a * d - b * c < 0;
  for (const el of elements) {
    sink.beginElement({ index: el.index, ...(el.copy ? { copy: el.copy } : {}), label: el.label, group: el.group });
    for (const ct of el.contours) {
      if (ct.xy) {
        polyline(sink, ct.xy, ct.closed, m, stats);
        continue;
      }
      const segs = ct.segments;
      if (segs.length === 0) continue;
      sink.moveTo(X(segs[0].x0, segs[0].y0), Y(segs[0].x0, segs[0].y0));
      stats.travels++;
      for (let k = 0; k < segs.length; k++) {
        const s = segs[k];
        const g = arcGeometry(s);
        if (!g) {
          sink.lineTo(X(s.x1, s.y1), Y(s.x1, s.y1));
          stats.lines++;
          continue;
        }
        // Arcs that go on along the same circle (the fitter may close a circle with a short arc) are one move.
        let sweep = g.sweep, last = s;
        while (k + 1 < segs.length) {
          const h = arcGeometry(segs[k + 1]);
          if (!h || (h.sweep > 0) !== (g.sweep > 0) || Math.abs(h.r - g.r) > SAME_CIRCLE_MM || Math.hypot(h.cx - g.cx, h.cy - g.cy) > SAME_CIRCLE_MM) break;
          sweep += h.sweep;
          last = segs[++k];
        }
        const ccw = (g.sweep > 0) !== mirror;
        const cx = X(g.cx, g.cy), cy = Y(g.cx, g.cy);
        // Equal pieces of at most SPLIT_SWEEP (two for a whole circle), the last ending exactly on the run's end.
        const pieces = Math.abs(sweep) > SPLIT_SWEEP ? Math.ceil(Math.abs(sweep) / Math.PI) : 1;
        const dx = s.x0 - g.cx, dy = s.y0 - g.cy;
        for (let p = 1; p < pieces; p++) {
          const h = (sweep * p) / pieces, ch = Math.cos(h), sh = Math.sin(h);
          const mx = g.cx + dx * ch - dy * sh, my = g.cy + dx * sh + dy * ch;
          sink.arcTo(X(mx, my), Y(mx, my), cx, cy, ccw);
          stats.arcs++;
        }
        sink.arcTo(X(last.x1, last.y1), Y(last.x1, last.y1), cx, cy, ccw);
        stats.arcs++;
      }
    }
  }
  return stats;
}

/** A polyline of page mm (x,y pairs), closed or open. */
export interface PagePolyline {
  xy: Float64Array;
  closed: boolean;
}

/** Travel to a polyline's start and draw it with straight moves. */
function polyline(sink: MachineSink, xy: Float64Array, closed: boolean, m: Matrix, stats: MachineEmitStats): void {
  const n = xy.length >> 1;
  if (n < 2) return;
  const a = m[0], b = m[1], c = m[2], d = m[3], e = m[4], f = m[5];
  sink.moveTo(a * xy[0] + c * xy[1] + e, b * xy[0] + d * xy[1] + f);
  stats.travels++;
  const last = closed ? n : n - 1;
  for (let k = 1; k <= last; k++) {
    const i = (k % n) * 2;
    sink.lineTo(a * xy[i] + c * xy[i + 1] + e, b * xy[i] + d * xy[i + 1] + f);
    stats.lines++;
  }
}

/**
 * The same drawing as straight moves only (the baseline the refit is compared
 * with): every polyline vertex becomes a line. Does not call `finish`.
 */
export function emitPolylines(
  sink: MachineSink, elements: readonly { index: number; label: string; group: string; polylines: readonly PagePolyline[] }[], m: Matrix,
): MachineEmitStats {
  const stats: MachineEmitStats = { lines: 0, arcs: 0, travels: 0 };
  for (const el of elements) {
    sink.beginElement({ index: el.index, label: el.label, group: el.group });
    for (const p of el.polylines) polyline(sink, p.xy, p.closed, m, stats);
  }
  return stats;
}
