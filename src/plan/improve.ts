/**
 * Local search on the order: 2-opt (reverse a run of contours, which also flips
 * the direction of every open contour in it; Croes, Oper. Res. 6 (1958), from
 * memory) and Or-opt (move a run of one to three contours elsewhere, either way
 * round; I. Or, thesis, Northwestern University 1976, from memory), over
 * candidate lists of spatial neighbours with a work queue in place of a full scan
 * ("don't-look bits"; neighbour lists and don't-look bits as in Bentley, ORSA J.
 * Comput. 4 (1992), from memory), so a pass costs O(n·k) and not O(n²).
 *
 * For each contour a taken from the queue, every candidate contour c near a is
 * tried in every way that puts an end of a next to an end of c: 2-opt joining
 * the two exits or the two entries, and Or-opt moving a run that starts or ends at
 * a or at c next to the other, forwards or reversed. The best improving move is
 * made and the contours around it go back on the queue.
 */
import { dist, type Tour } from './tour.js';

/** Smallest gain taken (mm): below it, rounding could make a move loop forever. */
const EPS = 1e-9;

/** Settings of the search. */
export interface ImproveLimits {
  /** Longest run reversed or shifted by one move (items), so a move on a huge job stays cheap. */
  maxSpan: number;
  /** Most moves made (a guard; the queue empties long before on real jobs). */
  maxMoves: number;
}

/**
 * Improve the tour in place.
 * @param cand candidate items per item, `k` a row, -1 where a row is short
 * @returns the number of moves made
 */
export function improve(t: Tour, cand: Int32Array, k: number, limits: ImproveLimits): number {
  const n = t.n;
  if (n < 2) return 0;
  const queue = new Int32Array(n);
  const queued = new Uint8Array(n);
  let head = 0, size = 0;
  const push = (i: number): void => {
    if (i < 0 || i >= n || queued[i]) return;
    queued[i] = 1;
    queue[(head + size++) % n] = i;
  };
  for (let p = 0; p < n; p++) push(t.seq[p]);
  let moves = 0;
  // The best move found for the current item: kind 0 = 2-opt (p, q); 1 = Or-opt (s, e, g, reversed).
  let bestGain = 0, kind = -1, m0 = 0, m1 = 0, m2 = 0, mRev = false;
  const tryTwo = (p: number, q: number): void => {
    if (p > q) {
      const x = p;
      p = q;
      q = x;
    }
    if (p === q || p < -1 || q >= n || q - p > limits.maxSpan) return;
    const gain = -t.twoOptDelta(p, q);
    if (gain > bestGain + EPS && t.twoOptAllowed(p, q)) {
      bestGain = gain;
      kind = 0;
      m0 = p;
      m1 = q;
    }
  };
  const tryOr = (s: number, e: number, g: number, reversed: boolean): void => {
    if (s < 0 || e >= n || g < -1 || g >= n || (g >= s - 1 && g <= e)) return;
    if ((g > e ? g - s : e - g) > limits.maxSpan) return;
    const gain = -t.orDelta(s, e, g, reversed);
    if (gain > bestGain + EPS && t.orAllowed(s, e, g, reversed)) {
      bestGain = gain;
      kind = 1;
      m0 = s;
      m1 = e;
      m2 = g;
      mRev = reversed;
    }
  };
  while (size > 0 && moves < limits.maxMoves) {
    const a = queue[head];
    head = (head + 1) % n;
    size--;
    queued[a] = 0;
    bestGain = 0;
    kind = -1;
    const i = t.pos[a];
    const eax = t.exitX(i), eay = t.exitY(i), nax = t.entryX(i), nay = t.entryY(i);
    // The edges leaving and entering a: a move only pays when its new edge at a is shorter than the one it
    // replaces there (the positive-gain rule of sequential exchanges, from memory), which prunes most tries.
    const dOut = t.hop(i, i + 1), dIn = t.hop(i - 1, i);
    for (let r = 0; r < k; r++) {
      const c = cand[a * k + r];
      if (c < 0) break;
      const j = t.pos[c];
      const ecx = t.exitX(j), ecy = t.exitY(j), ncx = t.entryX(j), ncy = t.entryY(j);
      const ee = dist(eax, eay, ecx, ecy), en = dist(eax, eay, ncx, ncy);
      const ne = dist(nax, nay, ecx, ecy), nn = dist(nax, nay, ncx, ncy);
      // 2-opt: exit of a next to exit of c, entry of a next to entry of c.
      if (ee < dOut) tryTwo(i, j);
      if (nn < dIn) tryTwo(i - 1, j - 1);
      for (let len = 1; len <= 3; len++) {
        // Runs starting or ending at c put next to a, and runs at a put next to c.
        if (en < dOut) {
          tryOr(j, j + len - 1, i, false); // c.. after a
          tryOr(i - len + 1, i, j - 1, false); // ..a before c
        }
        if (ne < dIn) {
          tryOr(j - len + 1, j, i - 1, false); // ..c before a
          tryOr(i, i + len - 1, j, false); // a.. after c
        }
        if (ee < dOut) {
          tryOr(j - len + 1, j, i, true); // ..c reversed after a
          tryOr(i - len + 1, i, j, true); // ..a reversed after c
        }
        if (nn < dIn) {
          tryOr(j, j + len - 1, i - 1, true); // c.. reversed before a
          tryOr(i, i + len - 1, j - 1, true); // a.. reversed before c
        }
      }
    }
    if (kind < 0) continue;
    // The contours at the ends of every edge the move replaces go back on the queue.
    let touched: number[];
    if (kind === 0) {
      touched = [m0, m0 + 1, m1, m1 + 1];
      t.twoOpt(m0, m1);
    } else {
      touched = [m0 - 1, m0, m1, m1 + 1, m2, m2 + 1];
      touched = touched.map((p) => (p >= 0 && p < n ? t.seq[p] : -1));
      t.orMove(m0, m1, m2, mRev);
      touched = touched.map((it) => (it >= 0 ? t.pos[it] : -1));
    }
    moves++;
    push(a);
    for (const p of touched) {
      if (p < 0 || p >= n) continue;
      push(t.seq[p]);
      if (p > 0) push(t.seq[p - 1]);
      if (p + 1 < n) push(t.seq[p + 1]);
    }
  }
  return moves;
}
