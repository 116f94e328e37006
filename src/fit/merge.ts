/**
 * Clean-ups after the search: neighbours on one circle (or one line) become one
 * piece, and arcs of absurd radius become lines where the line also fits.
 */
import { makePiece, pieceStartTangent, type Piece } from './piece.js';
import { lineFits } from './check.js';
import { TANGENT_EPS } from './closure.js';
import { rotorCentreX, rotorCentreY } from '../pga/motor.js';

/** Replace neighbouring pieces by one where one rotor piece covers both and keeps the tangent after them. */
export function mergeNeighbours(pts: Float64Array, pieces: Piece[], tol: number): Piece[] {
  if (pieces.length < 2) return pieces;
  const out = pieces.slice();
  const [t0x, t0y] = pieceStartTangent(out[0]);
  let i = 0;
  while (i + 1 < out.length) {
    const A = out[i], B = out[i + 1];
    if (A.kind === B.kind) {
      let bp: number, bq: number, br: number;
      if (i === 0) {
        bp = -t0x;
        bq = -t0y;
        br = 0;
      } else {
        const prev = out[i - 1];
        bp = prev.mp;
        bq = prev.mq;
        br = prev.mr;
      }
      const full = Math.hypot(B.x1 - A.x0, B.y1 - A.y0) <= 1e-9 * tol;
      const c = full ? null : makePiece(pts, A.a, B.b, bp, bq, br, A.x0, A.y0, B.x1, B.y1, tol);
      if (c && c.kind === A.kind && c.tx * B.tx + c.ty * B.ty > 0 && Math.abs(c.tx * B.ty - c.ty * B.tx) <= TANGENT_EPS) {
        out.splice(i, 2, c);
        continue;
      }
    }
    i++;
  }
  return out;
}

/** Largest tangent break (radians) a straightened arc may leave: 1e-4 rad ≈ 0.006°. */
export const MAX_KINK = 1e-4;

/** Arcs with a radius beyond `maxRadius` become their chord where the chord fits and the kink is negligible. */
export function straightenFlatArcs(pts: Float64Array, pieces: Piece[], maxRadius: number, tol: number): Piece[] {
  return pieces.map((p) => {
    if (p.kind !== 'arc') return p;
    const r = p.mr;
    const rad = Math.hypot(p.x0 - rotorCentreX(p.mq, r), p.y0 - rotorCentreY(p.mp, r));
    const dx = p.x1 - p.x0, dy = p.y1 - p.y0, l = Math.hypot(dx, dy);
    // The chord leaves the neighbours' tangents by half the arc's angle: only a negligible kink is allowed.
    if (rad <= maxRadius || l / (2 * rad) > MAX_KINK || !lineFits(pts, p.a, p.b, p.x0, p.y0, p.x1, p.y1, tol)) return p;
    // Written out in the order of every other piece (a spread makes objects of another shape, which deoptimizes their readers).
    return { kind: 'line', ms: 1, mp: -0.5 * dx, mq: -0.5 * dy, mr: 0, x0: p.x0, y0: p.y0, x1: p.x1, y1: p.y1, a: p.a, b: p.b, tx: dx / l, ty: dy / l };
  });
}
