/**
 * The copy factor of ./copies.ts (see its header for the derivation): how much
 * larger than where it stands a `<use>` draws each position, and the map of
 * a viewport target (`<svg>`, `<symbol>`) in a copy.
 */
import type { Matrix } from './matrixTypes.js';
import { invert, matrix, maxScale, multiply } from './matrix.js';
import { lengthToUser } from './units.js';
import { parsePreserveAspectRatio, parseViewBox, viewBoxTransform } from './viewport.js';
import type { TargetViewport, UseRef, UseTarget } from './copies.js';

/** The local map L of a viewport target in a copy made by `use` (module header). */
export function viewportMap(v: TargetViewport, use: UseRef): Matrix {
  const at = v.at;
  const w = lengthToUser(use.width ?? at.width, use.vw, use.vw);
  const h = lengthToUser(use.height ?? at.height, use.vh, use.vh);
  // A symbol is placed at the use's x, y (already in its placement); an svg keeps its own x, y.
  const x = v.kind === 'svg' ? lengthToUser(at.x, use.vw, 0) : 0;
  const y = v.kind === 'svg' ? lengthToUser(at.y, use.vh, 0) : 0;
  const vb = at.viewBox !== undefined ? parseViewBox(at.viewBox) : null;
  if (!(w > 0 && h > 0) && vb !== null) return matrix(0, 0, 0, 0, 0, 0); // draws nothing
  return vb !== null ? viewBoxTransform(vb, parsePreserveAspectRatio(at.preserveAspectRatio), x, y, w, h) : matrix(1, 0, 0, 1, x, y);
}

/**
 * The viewport a use gives a viewport target, as a rectangle [x, y, w, h] in
 * the coordinates `toRoot` maps to root user units (the use's placement,
 * then the target's own transform), or null when it does not clip
 * (overflow visible or auto).
 */
export function viewportClip(v: TargetViewport, use: UseRef): { toRoot: Matrix; rect: [number, number, number, number] } | null {
  if (!v.clips) return null;
  const at = v.at;
  const w = lengthToUser(use.width ?? at.width, use.vw, use.vw);
  const h = lengthToUser(use.height ?? at.height, use.vh, use.vh);
  const x = v.kind === 'svg' ? lengthToUser(at.x, use.vw, 0) : 0;
  const y = v.kind === 'svg' ? lengthToUser(at.y, use.vh, 0) : 0;
  const own = v.kind === 'svg' && v.own ? v.own : null;
  return { toRoot: own ? multiply(new Float64Array(6), use.placement, own) : use.placement, rect: [x, y, w, h] };
}

/** The largest factor a use's copy of a viewport target applies to its content, in root units (before the mm conjugation). */
export function viewportCopies(v: TargetViewport, use: UseRef): Matrix[] {
  const back = invert(new Float64Array(6), v.inner);
  if (!back) return [];
  const local = viewportMap(v, use);
  const withOwn = v.own ? multiply(new Float64Array(6), v.own, local) : local;
  const ways = v.kind === 'symbol' && v.own ? [local, withOwn] : [withOwn];
  return ways.map((l) => multiply(new Float64Array(6), multiply(new Float64Array(6), use.placement, l), back));
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
    if (toRoot && t.viewport !== null) {
      const maps = viewportCopies(t.viewport, use);
      if (maps.length > 0) {
        factor = 0;
        for (const m of maps) factor = Math.max(factor, maxScale(multiply(new Float64Array(6), multiply(new Float64Array(6), rootToMm, m), toRoot)));
      }
    } else if (back && toRoot) {
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

