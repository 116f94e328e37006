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
 *
 * The targets containing a position are its ancestors (and itself), so the
 * bound of a position is the largest over its ancestors' own uses: computed
 * once per element by walking up to the nearest ancestor already known.
 */
import type { Matrix } from './matrixTypes.js';
import { identityMatrix, invert, matrix, maxScale, multiply } from './matrix.js';
import { lengthToUser } from './units.js';

/** An element with an id, as a target of `<use>`: where it lies in document order and its parent's CTM. */
export interface UseTarget {
  /** Document-order index of the element and of its last descendant. */
  first: number;
  last: number;
  /** CTM of the system the target stands in (its parent's), root user units. */
  parentCtm: Matrix;
  /** Whether it is an `<svg>`, whose viewport a use's width and height replace. */
  isSvg: boolean;
}

/** A `<use>` element: what it points at and where it places it. */
export interface UseRef {
  /** Document-order index of the use element. */
  index: number;
  /** The id it references (without '#'). */
  target: string;
  /** The use's CTM with its translate(x, y) applied after its transform, root user units. */
  placement: Matrix;
  /** Whether it sets width or height (which resize a referenced `<svg>`'s viewport, S2 §5.6). */
  sized: boolean;
}

/** Longest chain of uses followed; beyond it (or round a cycle) the bound is Infinity. */
export const MAX_CHAIN = 16;

/**
 * For each document position in `positions`, the largest factor by which a
 * copy drawn by `<use>` enlarges it, in millimetres: 1 when it is drawn only
 * where it stands or only smaller.
 * @param parentOf the parent's document-order index of every element (−1 for the root)
 */
export function copyScales(
  positions: readonly number[], uses: readonly UseRef[], targets: ReadonlyMap<string, UseTarget>,
  parentOf: ArrayLike<number>, rootToMm: Matrix,
): number[] {
  if (uses.length === 0) return positions.map(() => 1);
  const toRoot = invert(new Float64Array(6), rootToMm);
  // The uses of each target element (by its index), with the factor each applies.
  const usesOf = new Map<number, { at: number; factor: number }[]>();
  for (const use of uses) {
    const t = targets.get(use.target);
    // A use inside what it references is a circular reference: in error, it draws nothing (S2 §5.6).
    if (!t || (use.index >= t.first && use.index <= t.last)) continue;
    const back = invert(new Float64Array(6), t.parentCtm);
    let factor = Infinity;
    // A resized <svg> viewport changes its content's scale in a way not counted here: no bound (left as written).
    if (back && toRoot && !(t.isSvg && use.sized)) {
      const m = multiply(new Float64Array(6), multiply(new Float64Array(6), rootToMm, use.placement), multiply(new Float64Array(6), back, toRoot));
      factor = maxScale(m);
    }
    const list = usesOf.get(t.first) ?? [];
    list.push({ at: use.index, factor: Number.isFinite(factor) ? factor : Infinity });
    usesOf.set(t.first, list);
  }
  // bound[i]: the largest factor over i and its ancestors' own uses; 0 = not known yet; −1 = being worked out.
  const bound = new Float64Array(parentOf.length);
  const boundAt = (pos: number, depth: number): number => {
    if (depth > MAX_CHAIN) return Infinity;
    // Walk up to the nearest ancestor already known (or past the root), then fill in downwards.
    const chain: number[] = [];
    let a = pos, above = 1;
    while (a >= 0) {
      if (bound[a] > 0) {
        above = bound[a];
        break;
      }
      if (bound[a] < 0) return Infinity; // a cycle through uses
      chain.push(a);
      a = parentOf[a];
    }
    for (let k = chain.length - 1; k >= 0; k--) {
      const x = chain[k];
      let s = above;
      const own = usesOf.get(x);
      if (own) {
        bound[x] = -1;
        for (const u of own) s = Math.max(s, u.factor * boundAt(u.at, depth + 1));
      }
      bound[x] = s;
      above = s;
    }
    return above;
  };
  return positions.map((p) => boundAt(p, 0));
}

const XLINK_NS = 'http://www.w3.org/1999/xlink';

/**
 * Collects, while the reader walks the document, what `copyScales` needs:
 * every element's parent, the first element with each id, and the uses.
 */
export class CopyRecorder {
  private readonly targets = new Map<string, UseTarget>();
  private readonly uses: UseRef[] = [];
  private readonly parentOf: number[] = [];
  private readonly indexAt: number[] = [];
  private readonly idAt: (string | null)[] = [];

  /**
   * An element opens at `depth` (its start tag was just read).
   * @param ctm its CTM (after its own transform), root user units
   * @param parentCtm its parent's CTM (null for the root)
   * @param ns prefix → namespace URI in scope, for xlink:href
   * @param vw, vh size of the nearest viewport, for percentages in x and y
   */
  open(
    index: number, depth: number, name: string | null, id: string | null, at: Record<string, string>,
    ctm: Matrix, parentCtm: Matrix | null, ns: Record<string, string>, vw: number, vh: number,
  ): void {
    this.parentOf[index] = depth > 0 ? this.indexAt[depth - 1] : -1;
    this.indexAt[depth] = index;
    this.idAt[depth] = null;
    if (id !== null && !this.targets.has(id)) {
      this.targets.set(id, { first: index, last: index, parentCtm: parentCtm ?? identityMatrix(), isSvg: name === 'svg' });
      this.idAt[depth] = id;
    }
    if (name !== 'use') return;
    // S2 §5.6: href, or xlink:href under any prefix bound to XLink; only references into this document.
    let href = at.href;
    if (href === undefined) for (const k in at) if (k.endsWith(':href') && ns[k.slice(0, -5)] === XLINK_NS) href = at[k];
    const ref = href?.trim();
    if (ref === undefined || !ref.startsWith('#') || ref.length < 2) return;
    const x = lengthToUser(at.x, vw, 0), y = lengthToUser(at.y, vh, 0);
    const placement = multiply(new Float64Array(6), ctm, matrix(1, 0, 0, 1, x, y));
    this.uses.push({ index, target: ref.slice(1), placement, sized: at.width !== undefined || at.height !== undefined });
  }

  /** The element open at `depth` closes; `lastIndex` is the document-order index of its last descendant. */
  close(depth: number, lastIndex: number): void {
    const id = this.idAt[depth];
    if (id !== null && id !== undefined) this.targets.get(id)!.last = lastIndex;
  }

  /** `copyScales` for these positions. */
  scales(positions: readonly number[], rootToMm: Matrix): number[] {
    return copyScales(positions, this.uses, this.targets, this.parentOf, rootToMm);
  }
}
