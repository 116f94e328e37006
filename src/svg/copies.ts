/**
 * Copies drawn by `<use>`: how much larger than where it stands each geometry
 * element may be drawn elsewhere, so that a refit within the tolerance there
 * stays within it in every copy.
 *
 * A `<use>` draws its target as if it stood in a group with the use's
 * transform followed by translate(x, y) (S2 §5.6), so a point of the target's
 * parent system p goes to U · P⁻¹ · p in root user units, U being the use's
 * placement and P the target parent's CTM. In millimetres the copy is the
 * original under R · U · P⁻¹ · R⁻¹ (R = root → mm), and a deviation d where the
 * element stands becomes at most ‖R · U · P⁻¹ · R⁻¹‖ · d in the copy (operator
 * norm: the largest singular value). A use may itself lie inside another use's
 * target: the factors multiply along the chain, a bound that never
 * underestimates (‖AB‖ ≤ ‖A‖ ‖B‖).
 *
 * Every recorded `<use>` counts, rendered or not: a copy that is never drawn
 * only makes the bound stricter. A use inside its own target draws nothing
 * (a circular reference) and is skipped; chains deeper than MAX_CHAIN, and
 * cycles through several uses, give Infinity.
 */
import type { Matrix } from './matrixTypes.js';
import { invert, maxScale, multiply } from './matrix.js';

/** An element with an id, as a target of `<use>`: where it lies in document order and its parent's CTM. */
export interface UseTarget {
  /** Document-order index of the element and of its last descendant. */
  first: number;
  last: number;
  /** CTM of the system the target stands in (its parent's), root user units. */
  parentCtm: Matrix;
}

/** A `<use>` element: what it points at and where it places it. */
export interface UseRef {
  /** Document-order index of the use element. */
  index: number;
  /** The id it references (without '#'). */
  target: string;
  /** The use's CTM with its translate(x, y) applied after its transform, root user units. */
  placement: Matrix;
}

/** Longest chain of uses followed; beyond it (or round a cycle) the bound is Infinity. */
export const MAX_CHAIN = 16;
/** More uses than this are not followed (the work grows with their square): what they copy gets Infinity. */
export const MAX_USES = 20_000;

/**
 * For each document position in `positions` (ascending document-order
 * indices), the largest factor by which a copy drawn by `<use>` enlarges it,
 * in millimetres: 1 when it is drawn only where it stands or only smaller.
 */
export function copyScales(
  positions: readonly number[], uses: readonly UseRef[], targets: ReadonlyMap<string, UseTarget>, rootToMm: Matrix,
): number[] {
  const out = positions.map(() => 1);
  if (uses.length === 0) return out;
  const toRoot = invert(new Float64Array(6), rootToMm);
  // Each use's own factor and the document range it copies.
  const live: { use: UseRef; t: UseTarget; factor: number }[] = [];
  for (const use of uses) {
    const t = targets.get(use.target);
    // A use inside what it references is a circular reference: in error, it draws nothing (S2 §5.6).
    if (!t || (use.index >= t.first && use.index <= t.last)) continue;
    const back = invert(new Float64Array(6), t.parentCtm);
    let factor = Infinity;
    if (back && toRoot) {
      const m = multiply(new Float64Array(6), multiply(new Float64Array(6), rootToMm, use.placement), multiply(new Float64Array(6), back, toRoot));
      factor = maxScale(m);
    }
    live.push({ use, t, factor: Number.isFinite(factor) ? factor : Infinity });
  }
  // By where their targets start, so a position need look only at targets that start before it.
  live.sort((a, b) => a.t.first - b.t.first);
  const tooMany = uses.length > MAX_USES;
  // The factor of a position: over the uses whose target contains it, that use's factor times the use's own position's.
  const memo = new Map<number, number>();
  const onStack = new Set<number>();
  const scaleAt = (pos: number, depth: number): number => {
    const known = memo.get(pos);
    if (known !== undefined) return known;
    if (depth > MAX_CHAIN || onStack.has(pos)) return Infinity;
    onStack.add(pos);
    let s = 1;
    for (const l of live) {
      if (l.t.first > pos) break;
      if (pos > l.t.last) continue;
      s = tooMany ? Infinity : Math.max(s, l.factor * scaleAt(l.use.index, depth + 1));
      if (s === Infinity) break;
    }
    onStack.delete(pos);
    memo.set(pos, s);
    return s;
  };
  for (let i = 0; i < positions.length; i++) out[i] = scaleAt(positions[i], 0);
  return out;
}
