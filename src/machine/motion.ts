/**
 * Estimated machine time: a motion model of our own. The G-code standard says
 * nothing about acceleration (NIST RS274NGC v3 only says G64 corners may be
 * rounded to keep the feed), so every time estimate is a model; this one:
 *
 * 1. Feed limit: each move runs at most at its feed (F/60 mm/s; travel at the
 *    profile's travel feed).
 * 2. Acceleration limit: one path acceleration `a` (mm/s²), speeding up and
 *    slowing down along the path; on an arc the speed is also capped by its
 *    centripetal acceleration, v ≤ √(a·r) (uniform circular motion). The two
 *    are taken apart (tangential a plus the cap), not as one vector limit.
 * 3. Junction speed: where two moves meet at an angle θ between them, the
 *    speed of uniform circular motion on the circle tangent to both whose
 *    nearest point is δ from the corner: v² = a·δ·s/(1 − s), s = sin(θ/2)
 *    (REFERENCES §13.2). Tangent joins (arcs after fitting) have no limit here.
 *    The tool passes through the corner; δ is a model parameter, not a path
 *    error. A tool switch (travel ↔ work) is a full stop, plus the profile's
 *    seconds per switch.
 * 4. Look-ahead: the planner holds `lookAhead` moves, the running one
 *    included; the speed at the end of the running move must allow a stop by
 *    the end of the last move it holds.
 * 5. Speeds at junctions by a backward and a forward pass (REFERENCES §13.4),
 *    each move then a trapezoid or triangle profile between them (§13.1).
 *
 * Limits: no jerk limit, no per-axis limits (a Cartesian machine limits each
 * axis, `min a_i/|u_i|` along a direction), no serial-line or block-processing
 * rate (a controller fed many tiny moves may starve), pen or Z moves only as
 * the fixed switch time; an arc counts as one move of the look-ahead, while
 * controllers that cut arcs into short lines internally count those lines (the
 * model is optimistic for them). Dwell lines in the profile are not read.
 */
import type { MachineMove } from './sink.js';

/** Parameters of the model. */
export interface MotionParams {
  /** mm/s², path acceleration. */
  acceleration: number;
  /** mm, corner parameter δ. */
  junctionDeviation: number;
  /** Moves the planner sees (≥ 1). */
  lookAhead: number;
  /** mm/min, travel speed. */
  travelFeed: number;
  /** mm/min, work feed of a stroke colour. */
  workFeed: (group: string) => number;
  /** s per tool switch. */
  toolSwitchSeconds: number;
}

/** The estimate. */
export interface MotionEstimate {
  /** s, everything. */
  seconds: number;
  /** s, in work moves. */
  workSeconds: number;
  /** s, in travel. */
  travelSeconds: number;
  /** s, in tool switches. */
  switchSeconds: number;
  /** mm, work path length. */
  workLength: number;
  /** mm, travel length. */
  travelLength: number;
}

/**
 * Time of one move of length L entering at v0, leaving at v1, cruising at most
 * at v (mm, mm/s, mm/s²): trapezoid, or triangle when it cannot reach v.
 * Needs |v1² − v0²| ≤ 2aL (the planner guarantees it).
 */
export function moveTime(L: number, v0: number, v1: number, v: number, a: number): number {
  if (!(L > 0)) return 0;
  const vp = Math.min(v, Math.sqrt((2 * a * L + v0 * v0 + v1 * v1) / 2));
  if (!(vp > 0)) return 0;
  const cruise = L - (2 * vp * vp - v0 * v0 - v1 * v1) / (2 * a);
  return (vp - v0) / a + (vp - v1) / a + Math.max(0, cruise) / vp;
}

/** Junction speed limit (mm/s) for unit directions in (u1) and out (u2), from δ and a. */
export function junctionSpeed(u1x: number, u1y: number, u2x: number, u2y: number, a: number, delta: number): number {
  const dot = u1x * u2x + u1y * u2y;
  if (dot >= 1 - 1e-12) return Infinity; // straight on (or tangent)
  const s = Math.sqrt(Math.max(0, (1 + dot) / 2)); // sin(θ/2), θ the angle between the two moves
  if (s <= 1e-12) return 0; // reversal
  return Math.sqrt((a * delta * s) / (1 - s));
}

/**
 * Junction speeds by the two passes (REFERENCES §13.4), in place.
 * @param L move lengths (n)
 * @param v junction limits (n + 1; v[0] and v[n] are the path's ends), overwritten with the planned speeds
 */
export function planSpeeds(L: ArrayLike<number>, v: Float64Array, a: number): Float64Array {
  const n = L.length;
  for (let j = n - 1; j >= 0; j--) v[j] = Math.min(v[j], Math.sqrt(v[j + 1] * v[j + 1] + 2 * a * L[j]));
  for (let j = 1; j <= n; j++) v[j] = Math.min(v[j], Math.sqrt(v[j - 1] * v[j - 1] + 2 * a * L[j - 1]));
  return v;
}

/** Estimate the time of a recorded program (machine mm). */
export function estimateTime(moves: readonly MachineMove[], p: MotionParams): MotionEstimate {
  const n = moves.length, a = p.acceleration;
  const L = new Float64Array(n), vmax = new Float64Array(n);
  const din = new Float64Array(2 * n), dout = new Float64Array(2 * n);
  const out: MotionEstimate = { seconds: 0, workSeconds: 0, travelSeconds: 0, switchSeconds: 0, workLength: 0, travelLength: 0 };
  for (let k = 0; k < n; k++) {
    const m = moves[k];
    const dx = m.x - m.x0, dy = m.y - m.y0, c = Math.hypot(dx, dy);
    if (m.kind === 'arc') {
      const r0x = m.x0 - m.cx, r0y = m.y0 - m.cy, r1x = m.x - m.cx, r1y = m.y - m.cy;
      const r = Math.hypot(r0x, r0y);
      let sweep = Math.atan2(r0x * r1y - r0y * r1x, r0x * r1x + r0y * r1y); // (−π, π]
      if (m.ccw && sweep <= 0) sweep += 2 * Math.PI;
      if (!m.ccw && sweep >= 0) sweep -= 2 * Math.PI;
      L[k] = r * Math.abs(sweep);
      vmax[k] = Math.min(p.workFeed(m.group) / 60, Math.sqrt(a * r));
      // Tangents: the radius turned a quarter in the sense of travel.
      const sg = m.ccw ? 1 : -1, r1 = Math.hypot(r1x, r1y) || 1;
      din[2 * k] = (-sg * r0y) / (r || 1);
      din[2 * k + 1] = (sg * r0x) / (r || 1);
      dout[2 * k] = (-sg * r1y) / r1;
      dout[2 * k + 1] = (sg * r1x) / r1;
    } else {
      L[k] = c;
      vmax[k] = (m.kind === 'travel' ? p.travelFeed : p.workFeed(m.group)) / 60;
      din[2 * k] = dout[2 * k] = c > 0 ? dx / c : 0;
      din[2 * k + 1] = dout[2 * k + 1] = c > 0 ? dy / c : 0;
    }
  }
  // Junction limits; v[k] is the speed entering move k.
  const v = new Float64Array(n + 1);
  let switches = 0;
  for (let k = 1; k < n; k++) {
    const prev = moves[k - 1].kind === 'travel', cur = moves[k].kind === 'travel';
    if (prev !== cur) {
      switches++;
      v[k] = 0;
      continue;
    }
    v[k] = Math.min(vmax[k - 1], vmax[k], junctionSpeed(dout[2 * k - 2], dout[2 * k - 1], din[2 * k], din[2 * k + 1], a, p.junctionDeviation));
  }
  if (n > 0 && moves[n - 1].kind !== 'travel') switches++; // the last tool off
  v[0] = 0;
  v[n] = 0;
  windowLimit(L, v, a, Math.max(1, Math.floor(p.lookAhead)));
  planSpeeds(L, v, a);
  for (let k = 0; k < n; k++) {
    const t = moveTime(L[k], v[k], v[k + 1], vmax[k], a);
    if (moves[k].kind === 'travel') {
      out.travelSeconds += t;
      out.travelLength += L[k];
    } else {
      out.workSeconds += t;
      out.workLength += L[k];
    }
  }
  out.switchSeconds = switches * p.toolSwitchSeconds;
  out.seconds = out.workSeconds + out.travelSeconds + out.switchSeconds;
  return out;
}

/**
 * Look-ahead: the planner holds N moves, the running one included, and the
 * profile of the running move k − 1 is fixed with the moves it then sees: the
 * speed at its end (junction k) must allow a stop by the end of move
 * k + N − 2, keeping every junction limit on the way. N = 1 stops after every
 * move.
 */
function windowLimit(L: Float64Array, v: Float64Array, a: number, N: number): void {
  const n = L.length;
  const lim = Float64Array.from(v);
  for (let k = 1; k < n; k++) {
    const end = k + N - 1; // first move past the window
    if (end >= n) break; // from here on the window reaches the program's end: the global passes do it
    let w = 0; // stop at the window's end
    for (let j = end - 1; j >= k; j--) w = Math.min(lim[j], Math.sqrt(w * w + 2 * a * L[j]));
    if (w < v[k]) v[k] = w;
  }
}
