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
 * A `<symbol>` is drawn as a viewport (S2 §5.5): the copy maps its content by
 * U · V, V being the map of the symbol's viewBox onto the use's width and
 * height (100 % when absent) with its preserveAspectRatio; a referenced
 * `<svg>` likewise gets the use's width and height in place of its own
 * (S2 §5.6). So in general the copy maps the content of a target whose own
 * CTM is C (what its children see where it stands) by U · L · C⁻¹, L being
 * the target's local map in the copy; for a plain element L·C⁻¹ = P⁻¹. A
 * symbol's own transform (SVG 2 allows one, SVG 1.1 does not) is counted
 * both ways and the larger factor kept.
 *
 * The targets containing a position are its ancestors (and itself), so the
 * bound of a position is the largest over its ancestors' own uses: computed
 * once per element by walking up to the nearest ancestor already known.
 *
 * Which elements a `<use>` draws ({@link CopyRecorder.drawnByUse}): geometry
 * in defs or a symbol is drawn when a drawn use references it or an ancestor
 * of it, and nothing between that target and the element (itself included)
 * keeps it from being rendered (display none, a clipPath, …).
 */
import type { Matrix } from './matrixTypes.js';
import { identityMatrix, invert, matrix, multiply } from './matrix.js';
import { lengthToUser } from './units.js';
import { copyScales, MAX_CHAIN, viewportClip, viewportCopies } from './copyFactor.js';

export { copyScales, MAX_CHAIN } from './copyFactor.js';

/** An element with an id, as a target of `<use>`: where it lies in document order and its parent's CTM. */
export interface UseTarget {
  /** Document-order index of the element and of its last descendant. */
  first: number;
  last: number;
  /** CTM of the system the target stands in (its parent's), root user units. */
  parentCtm: Matrix;
  /** Whether it is an `<svg>`, whose viewport a use's width and height replace. */
  isSvg: boolean;
  /** Viewport data of an `<svg>` or `<symbol>` target, else null. */
  viewport: TargetViewport | null;
}

/** What a use needs to place an `<svg>` or `<symbol>` target's viewport. */
export interface TargetViewport {
  kind: 'svg' | 'symbol';
  /** The target's CTM as read where it stands (what its children see), root user units. */
  inner: Matrix;
  /** Its own transform, or null. */
  own: Matrix | null;
  /** Its attributes (x, y, width, height, viewBox, preserveAspectRatio). */
  at: Record<string, string>;
  /** Whether its viewport clips what it draws (computed overflow hidden, scroll or clip). */
  clips: boolean;
}

/** A viewport that clips a copy: the rectangle [x, y, w, h] in the coordinates `toRoot` maps to root user units. */
export interface ClipRect {
  toRoot: Matrix;
  rect: [number, number, number, number];
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
  /** Its width and height attributes, and its viewport size (user units) for their percentages. */
  width?: string;
  height?: string;
  vw: number;
  vh: number;
}

/** One copy of an element drawn by `<use>` (CopyRecorder.copiesOf). */
export interface CopyPlace {
  /** Where it stands → where the copy is, root user units. */
  map: Matrix;
  /** Document index of the use that draws it (the innermost of a chain), and of that use's target. */
  use: number;
  target: number;
  /** The viewports of symbols and svg elements the copy is drawn through (each clips it), innermost first. */
  clips: ClipRect[];
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
  private readonly depthOf: number[] = [];
  private readonly blockOf: number[] = [];
  private readonly inPlace: boolean[] = [];

  /**
   * An element opens at `depth` (its start tag was just read).
   * @param ctm its CTM (after its own transform), root user units
   * @param parentCtm its parent's CTM (null for the root)
   * @param ns prefix → namespace URI in scope, for xlink:href
   * @param vw, vh size of the nearest viewport, for percentages in x and y
   * @param own the element's own transform, or null
   * @param clips whether, as a viewport target (svg, symbol), it clips what it draws
   */
  open(
    index: number, depth: number, name: string | null, id: string | null, at: Record<string, string>,
    ctm: Matrix, parentCtm: Matrix | null, ns: Record<string, string>, vw: number, vh: number, own: Matrix | null = null, clips = true,
  ): void {
    this.parentOf[index] = depth > 0 ? this.indexAt[depth - 1] : -1;
    this.indexAt[depth] = index;
    this.depthOf[index] = depth;
    this.idAt[depth] = null;
    if (id !== null && !this.targets.has(id)) {
      const viewport: TargetViewport | null = (name === 'svg' && depth > 0) || name === 'symbol'
        ? { kind: name === 'svg' ? 'svg' : 'symbol', inner: ctm, own, at, clips }
        : null;
      this.targets.set(id, { first: index, last: index, parentCtm: parentCtm ?? identityMatrix(), isSvg: name === 'svg', viewport });
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
    this.uses.push({
      index, target: ref.slice(1), placement, sized: at.width !== undefined || at.height !== undefined,
      width: at.width, height: at.height, vw, vh,
    });
  }

  /**
   * What keeps the element just opened from being drawn.
   * @param block deepest depth at or above it (itself included) with a reason a use does not lift, −1 for none
   * @param inPlace whether it is rendered where it stands
   */
  state(index: number, block: number, inPlace: boolean): void {
    this.blockOf[index] = block;
    this.inPlace[index] = inPlace;
  }

  /** For each position, whether it is drawn only through a use (module header); false for what is drawn in place. */
  drawnByUse(positions: readonly number[]): boolean[] {
    if (this.uses.length === 0) return positions.map(() => false);
    const usesOf = new Map<number, number[]>();
    for (const u of this.uses) {
      const t = this.targets.get(u.target);
      if (!t || (u.index >= t.first && u.index <= t.last)) continue;
      const list = usesOf.get(t.first) ?? [];
      list.push(u.index);
      usesOf.set(t.first, list);
    }
    // 0 unknown, 1 drawn, 2 not drawn, 3 being worked out (a cycle draws nothing).
    const memo = new Uint8Array(this.parentOf.length);
    const drawn = (pos: number, hops: number): boolean => {
      if (this.inPlace[pos]) return true;
      if (memo[pos] !== 0) return memo[pos] === 1;
      if (hops > MAX_CHAIN) return false;
      memo[pos] = 3;
      let yes = false;
      for (let a = pos; a >= 0 && !yes; a = this.parentOf[a]) {
        if (this.blockOf[pos] >= this.depthOf[a]) break; // blocked at or below this target
        const us = usesOf.get(a);
        if (us) for (const u of us) if (drawn(u, hops + 1)) { yes = true; break; }
      }
      memo[pos] = yes ? 1 : 2;
      return yes;
    };
    return positions.map((p) => !this.inPlace[p] && drawn(p, 0));
  }

  /** The element open at `depth` closes; `lastIndex` is the document-order index of its last descendant. */
  close(depth: number, lastIndex: number): void {
    const id = this.idAt[depth];
    if (id !== null && id !== undefined) this.targets.get(id)!.last = lastIndex;
  }

  /**
   * Every copy a drawn use draws of each position, as the map from where it
   * stands to where the copy is (root user units; compose with the element's
   * CTM), with the use that draws it (the last of a chain, whose style the
   * copy inherits). Copies of copies through chains of uses are included, up
   * to `maxCopies` per position and `maxTotal` over all positions (uses that
   * multiply copies exponentially are hostile input; `truncated` then says
   * so). A symbol's own transform is left out here (SVG 1.1; the bound of
   * `scales` counts it both ways).
   */
  copiesOf(positions: readonly number[], maxCopies = 4096, maxTotal = 100_000): { places: CopyPlace[][]; truncated: boolean } {
    if (this.uses.length === 0) return { places: positions.map(() => []), truncated: false };
    const usesOf = new Map<number, { at: number; map: Matrix; target: number; clip: ClipRect | null }[]>();
    for (const u of this.uses) {
      const t = this.targets.get(u.target);
      if (!t || (u.index >= t.first && u.index <= t.last)) continue;
      let map: Matrix | null;
      if (t.viewport !== null) {
        const maps = viewportCopies({ ...t.viewport, own: t.viewport.kind === 'symbol' ? null : t.viewport.own }, u);
        map = maps.length > 0 ? maps[0] : null;
      } else {
        const back = invert(new Float64Array(6), t.parentCtm);
        map = back ? multiply(new Float64Array(6), u.placement, back) : null;
      }
      if (map === null) continue;
      const list = usesOf.get(t.first) ?? [];
      list.push({ at: u.index, map, target: t.first, clip: t.viewport !== null ? viewportClip(t.viewport, u) : null });
      usesOf.set(t.first, list);
    }
    const memo = new Map<number, CopyPlace[]>();
    const placesOf = (pos: number, hops: number): CopyPlace[] => {
      const hit = memo.get(pos);
      if (hit) return hit;
      const out: CopyPlace[] = [];
      if (hops > MAX_CHAIN) return out;
      memo.set(pos, out); // a cycle finds this (empty so far) list and adds nothing
      if (this.inPlace[pos]) out.push({ map: identityMatrix(), use: -1, target: -1, clips: [] });
      for (let a = pos; a >= 0 && out.length < maxCopies; a = this.parentOf[a]) {
        if (this.blockOf[pos] >= this.depthOf[a]) break;
        const us = usesOf.get(a);
        if (!us) continue;
        for (const u of us) {
          for (const w of placesOf(u.at, hops + 1)) {
            if (out.length >= maxCopies) break;
            // The use's own viewport, then those the use itself is drawn through, all carried to where this copy is.
            const clips = u.clip ? [{ toRoot: multiply(new Float64Array(6), w.map, u.clip.toRoot), rect: u.clip.rect }, ...w.clips] : w.clips;
            out.push({ map: multiply(new Float64Array(6), w.map, u.map), use: u.at, target: u.target, clips });
          }
        }
      }
      return out;
    };
    let total = 0, truncated = false;
    const places = positions.map((p) => {
      const list = placesOf(p, 0).filter((c) => c.use >= 0);
      if (list.length >= maxCopies) truncated = true;
      const room = Math.max(0, maxTotal - total);
      if (list.length > room) truncated = true;
      const kept = list.length > room ? list.slice(0, room) : list;
      total += kept.length;
      return kept;
    });
    return { places, truncated };
  }

  /** `copyScales` for these positions. */
  scales(positions: readonly number[], rootToMm: Matrix): number[] {
    return copyScales(positions, this.uses, this.targets, this.parentOf, rootToMm);
  }
}
