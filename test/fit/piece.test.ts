import { describe, expect, it } from 'vitest';
import {
  ARC_PIECE, LINE_PIECE, makePiece, NO_PIECE, PIECE_FIELDS, PIECE_MP, PIECE_MQ, PIECE_MR, PIECE_TX, PIECE_TY, PIECE_X1, PIECE_Y1,
  STEP_ARGS, STEP_BP, STEP_BQ, STEP_BR, STEP_EX, STEP_EY, STEP_QX, STEP_QY, STEP_TOL, tryPiece,
} from '../../src/fit/piece.js';

/** Vertices on the circle about (cx, cy) of radius r from angle t0 to t1 (counter-clockwise), n + 1 of them. */
function onCircle(cx: number, cy: number, r: number, t0: number, t1: number, n: number): Float64Array {
  const out = new Float64Array(2 * (n + 1));
  for (let k = 0; k <= n; k++) {
    const t = t0 + ((t1 - t0) * k) / n;
    out[2 * k] = cx + r * Math.cos(t);
    out[2 * k + 1] = cy + r * Math.sin(t);
  }
  return out;
}

/** The argument block of tryPiece for a seed tangent (tx, ty) at the first vertex, ending at vertex `last`. */
function seedArgs(pts: Float64Array, last: number, tx: number, ty: number, tol: number): Float64Array {
  const g = new Float64Array(STEP_ARGS);
  // Seed motor 1 + n, n the tangent turned by −90°: bivector part (−tx, −ty, 0) (as the search seeds it).
  g[STEP_BP] = -tx;
  g[STEP_BQ] = -ty;
  g[STEP_BR] = 0;
  g[STEP_QX] = pts[0];
  g[STEP_QY] = pts[1];
  g[STEP_EX] = pts[2 * last];
  g[STEP_EY] = pts[2 * last + 1];
  g[STEP_TOL] = tol;
  return g;
}

describe('tryPiece: the step that carries a known tangent through a knot', () => {
  // Elementary geometry: the tangent of a circle is perpendicular to the radius at the point of contact,
  // so a circle touching the seed tangent at the start and passing through the knot is the original circle.
  // 24 chords of 0.05 rad on r = 10: each edge dips 10 (1 − cos 0.025) ≈ 0.0031 inside the circle (sagitta), under the tolerances used.
  const cx = 3, cy = -2, r = 10, n = 24;
  const pts = onCircle(cx, cy, r, 0.2, 1.4, n);
  const t0 = 0.2, t1 = 1.4;
  const tx = -Math.sin(t0), ty = Math.cos(t0);
  it('recovers the circle: centre from the motor, end point, end tangent', () => {
    const out = new Float64Array(PIECE_FIELDS);
    const kind = tryPiece(out, 0, pts, 0, n, seedArgs(pts, n, tx, ty, 0.005));
    expect(kind).toBe(ARC_PIECE);
    // Centre (−mq / mr, mp / mr) is the motor's fixed point (../shared/PGA.md conventions).
    expect(-out[PIECE_MQ] / out[PIECE_MR]).toBeCloseTo(cx, 9);
    expect(out[PIECE_MP] / out[PIECE_MR]).toBeCloseTo(cy, 9);
    expect(out[PIECE_X1]).toBe(pts[2 * n]);
    expect(out[PIECE_Y1]).toBe(pts[2 * n + 1]);
    expect(out[PIECE_TX]).toBeCloseTo(-Math.sin(t1), 9);
    expect(out[PIECE_TY]).toBeCloseTo(Math.cos(t1), 9);
  });

  it('writes at the offset it is given and agrees with makePiece', () => {
    const out = new Float64Array(3 * PIECE_FIELDS).fill(7);
    const g = seedArgs(pts, n, tx, ty, 0.005);
    expect(tryPiece(out, PIECE_FIELDS, pts, 0, n, g)).toBe(ARC_PIECE);
    expect([...out.subarray(0, PIECE_FIELDS)].every((v) => v === 7)).toBe(true);
    expect([...out.subarray(2 * PIECE_FIELDS)].every((v) => v === 7)).toBe(true);
    const p = makePiece(pts, 0, n, -tx, -ty, 0, pts[0], pts[1], pts[2 * n], pts[2 * n + 1], 0.005);
    expect(p).not.toBeNull();
    const o = PIECE_FIELDS;
    expect([p!.ms, p!.mp, p!.mq, p!.mr, p!.x1, p!.y1, p!.tx, p!.ty]).toEqual([...out.subarray(o, o + PIECE_FIELDS)]);
    expect(p!.kind).toBe('arc');
  });

  it('refuses the arc when the edges between vertices dip inside the circle by more than the tolerance', () => {
    // The sagitta of each chord is ≈ 0.0031 (above): under 0.005 it fits, under 0.002 it cannot.
    expect(tryPiece(new Float64Array(PIECE_FIELDS), 0, pts, 0, n, seedArgs(pts, n, tx, ty, 0.002))).toBe(NO_PIECE);
  });

  it('refuses a vertex pushed off the circle by more than the tolerance, keeps one pushed by less', () => {
    const tol = 0.02;
    for (const [push, fits] of [[0.99 * tol, true], [1.01 * tol, false]] as const) {
      const q = pts.slice();
      const k = n >> 1;
      const ux = q[2 * k] - cx, uy = q[2 * k + 1] - cy, ul = Math.hypot(ux, uy);
      q[2 * k] += (push * ux) / ul;
      q[2 * k + 1] += (push * uy) / ul;
      const kind = tryPiece(new Float64Array(PIECE_FIELDS), 0, q, 0, n, seedArgs(q, n, tx, ty, tol));
      expect(kind !== NO_PIECE).toBe(fits);
    }
  });

  it('gives a line along a straight run with its direction as the tangent', () => {
    const line = new Float64Array([1, 1, 2, 3, 3, 5, 4, 7]);
    const l = Math.hypot(1, 2);
    const out = new Float64Array(PIECE_FIELDS);
    expect(tryPiece(out, 0, line, 0, 3, seedArgs(line, 3, 1 / l, 2 / l, 1e-3))).toBe(LINE_PIECE);
    expect(out[PIECE_TX]).toBeCloseTo(1 / l, 12);
    expect(out[PIECE_TY]).toBeCloseTo(2 / l, 12);
    expect(out[PIECE_MR]).toBe(0);
  });
});
