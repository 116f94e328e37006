/**
 * Replay a fitted drawing into a machine sink, in machine coordinates.
 *
 * Each point goes through the page → machine matrix (./drawing.ts). Arcs: the
 * segment's centre and signed sweep are read off its motor (arcGeometry); the
 * flip has determinant −1, so it reverses the turning sense: a page sweep > 0
 * (from +x towards +y, y down) becomes clockwise seen from +Z, a G2. Arcs of
 * more than a half turn are written as two halves, so no written arc ever
 * starts and ends on the same point (a whole circle is two arcs) and no
 * rounding can turn a nearly closed arc into a full turn or a point.
 */
import { arcGeometry } from '../fit/segment.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { MachineElement } from './drawing.js';
import type { MachineSink } from './sink.js';

/** Arcs sweeping more than π + this (radians) are halved. */
export const HALF_TURN_EPS = 1e-9;

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
    sink.beginElement({ index: el.index, label: el.label, group: el.group });
    for (const ct of el.contours) {
      if (ct.segments.length === 0) continue;
      const s0 = ct.segments[0];
      sink.moveTo(X(s0.x0, s0.y0), Y(s0.x0, s0.y0));
      stats.travels++;
      for (const s of ct.segments) {
        const g = arcGeometry(s);
        if (!g) {
          sink.lineTo(X(s.x1, s.y1), Y(s.x1, s.y1));
          stats.lines++;
          continue;
        }
        const ccw = (g.sweep > 0) !== mirror;
        const cx = X(g.cx, g.cy), cy = Y(g.cx, g.cy);
        if (Math.abs(g.sweep) > Math.PI + HALF_TURN_EPS) {
          // Half-way point: the start rotated by half the sweep about the centre (page frame).
          const h = g.sweep / 2, ch = Math.cos(h), sh = Math.sin(h);
          const dx = s.x0 - g.cx, dy = s.y0 - g.cy;
          const mx = g.cx + dx * ch - dy * sh, my = g.cy + dx * sh + dy * ch;
          sink.arcTo(X(mx, my), Y(mx, my), cx, cy, ccw);
          stats.arcs++;
        }
        sink.arcTo(X(s.x1, s.y1), Y(s.x1, s.y1), cx, cy, ccw);
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

/**
 * The same drawing as straight moves only (the baseline the refit is compared
 * with): every polyline vertex becomes a line. Does not call `finish`.
 */
export function emitPolylines(
  sink: MachineSink, elements: readonly { index: number; label: string; group: string; polylines: readonly PagePolyline[] }[], m: Matrix,
): MachineEmitStats {
  const stats: MachineEmitStats = { lines: 0, arcs: 0, travels: 0 };
  const a = m[0], b = m[1], c = m[2], d = m[3], e = m[4], f = m[5];
  for (const el of elements) {
    sink.beginElement({ index: el.index, label: el.label, group: el.group });
    for (const p of el.polylines) {
      const n = p.xy.length >> 1;
      if (n < 2) continue;
      const xy = p.xy;
      sink.moveTo(a * xy[0] + c * xy[1] + e, b * xy[0] + d * xy[1] + f);
      stats.travels++;
      const last = p.closed ? n : n - 1;
      for (let k = 1; k <= last; k++) {
        const i = (k % n) * 2;
        sink.lineTo(a * xy[i] + c * xy[i + 1] + e, b * xy[i] + d * xy[i + 1] + f);
        stats.lines++;
      }
    }
  }
  return stats;
}
