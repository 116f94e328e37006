/**
 * Measure any two SVG documents against each other: an original and the
 * output of any program, or two runs with different options. Both are read
 * the same way (src/svg), every rendered geometry element is sampled from its
 * own geometry (path data, or a basic shape's equivalent path) through its own
 * matrix to mm, and distances come from the report's measurement
 * (./measure.ts), which shares no code with the fitter.
 *
 * Decisions where nothing standard says how:
 * - Pairing: elements whose id occurs exactly once in each document pair by
 *   id; the rest pair in document order among the remaining geometry
 *   elements; whatever is left over is listed as unpaired.
 * - The verdict counts the whole-document distance (all geometry of A against
 *   all of B: what a machine would cut) and every id pair; pairs by order only
 *   count when nothing is left unpaired, since a program that merges or splits
 *   elements makes order pairs meaningless while the whole drawing may match.
 * - Elements that draw nothing (empty data, a lone moveto) are not geometry
 *   here and are neither paired nor listed.
 */
import { readSvg, type GeometryElement, type SvgDocument } from '../svg/document.js';
import { parsePathData } from '../svg/pathData.js';
import { shapeToPath } from '../svg/shapes.js';
import type { PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';
import { drawnPlaces } from '../svg/reuse.js';
import { maxScale } from '../svg/matrix.js';
import { DEFAULT_OPTIONS } from '../options.js';
import { measureDeviation, compareSampled, DEFAULT_MAX_SAMPLES } from './measure.js';
import { samplePath, sampleCount, type SampledPath } from './sample.js';
import type { Deviation } from '../report/types.js';

/** Options for {@link compareSvg}. */
export interface CompareOptions {
  /** The bound to judge against, mm (> 0); also sets the sampling density (as in the report). */
  tolerance: number;
  /** mm per user unit for a document that states no physical size; default CSS px (25.4/96). */
  assumedMmPerUnit?: number;
}

/** Where to find an element: as in the report (document order, root svg = 0). */
export interface ElementRef {
  index: number;
  name: string;
  id: string | null;
  ancestors: string;
}

/** One pair of elements and their measured distance. */
export interface PairDeviation {
  a: ElementRef;
  b: ElementRef;
  /** How the pair was made. */
  by: 'id' | 'order';
  /** Measured from A's geometry to B's and back, mm (worstUser in B's user units). */
  deviation: Deviation;
  /** deviation.max ≤ tolerance. */
  withinTolerance: boolean;
}

/** The result of {@link compareSvg}; distances in mm. */
export interface Comparison {
  toleranceMm: number;
  pairs: PairDeviation[];
  /** Geometry elements of A with no partner in B, and the reverse. */
  unpairedA: ElementRef[];
  unpairedB: ElementRef[];
  /** All geometry of A against all of B (worstUser in B's root user units); null when either draws nothing. */
  whole: Deviation | null;
  totals: {
    pairs: number;
    /** Pairs over the tolerance. */
    overTolerance: number;
    /** Largest pair deviation, mm (0 without pairs). */
    maxPairDeviation: number;
    /** The verdict, see the module header. */
    withinTolerance: boolean;
  };
  /** Reading caveats of both documents, prefixed "A: " / "B: ". */
  warnings: string[];
}

/** A rendered geometry element that draws something, with its geometry in its own user units. */
export interface GeometryItem {
  el: GeometryElement;
  path: PathData;
  /** Every place it is drawn (where it stands, and each copy a use draws), element user units → mm. */
  places: Matrix[];
}
type Item = GeometryItem;

/** Most places of one pair measured one by one (after merging places that differ only by a translation). */
const MAX_PLACES = 64;

/**
 * Which of the first `k` places to measure: distances do not change under a
 * translation, so of places whose maps (in both documents) differ only in
 * their translation one is enough; beyond MAX_PLACES kinds, those drawn
 * largest (largest singular value) are kept.
 */
function distinctPlaces(a: readonly Matrix[], b: readonly Matrix[], k: number): { indices: number[]; capped: boolean } {
  const seen = new Map<string, number>();
  const key = (m: Matrix | undefined): string => (m ? `${m[0]},${m[1]},${m[2]},${m[3]}` : '-');
  for (let i = 0; i < k; i++) {
    const kk = `${key(a[i])}|${key(b[i])}`;
    if (!seen.has(kk)) seen.set(kk, i);
  }
  let indices = [...seen.values()];
  const capped = indices.length > MAX_PLACES;
  if (capped) indices = indices.sort((p, q) => maxScale(a[q]) - maxScale(a[p])).slice(0, MAX_PLACES);
  return { indices, capped };
}

/** Chord error of the whole-document sampling, as a fraction of the tolerance (as in measure.ts). */
const ERROR_FRACTION = 1 / 1000;
/** Longest chord of the whole-document sampling, in tolerances (as in measure.ts). */
const SPACING_FACTOR = 2;

/** The element's geometry as a renderer draws it (the valid part of data in error), noting errors. */
function geometryOf(el: GeometryElement, warnings: string[]): PathData | null {
  const where = `<${el.name}${el.id !== null ? ` id="${el.id}"` : ''}> (element ${el.index})`;
  if (el.name === 'path') {
    const p = parsePathData(el.attrs.d ?? '');
    if (p.error) warnings.push(`${where}: path data error at offset ${p.error.offset}: ${p.error.message}; the part before it is measured`);
    return p;
  }
  const s = shapeToPath(el.name, (a) => el.attrs[a], el.viewportW, el.viewportH);
  if (s.error && s.path !== null) warnings.push(`${where}: ${s.error}`);
  return s.path;
}

/** Whether path data draws anything (a segment after a moveto). */
function draws(p: PathData): boolean {
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] !== 0) return true;
  return false;
}

/**
 * The rendered geometry elements of a read document that draw something, in
 * document order; path data errors and shape errors are noted in `warnings`.
 */
export function geometryItems(doc: SvgDocument, warnings: string[]): GeometryItem[] {
  const out: Item[] = [];
  for (const el of doc.elements) {
    if (!el.rewritable) continue;
    const path = geometryOf(el, warnings);
    const places = drawnPlaces(el);
    if (path !== null && draws(path) && places.length > 0) out.push({ el, path, places });
  }
  return out;
}

function ref(el: GeometryElement): ElementRef {
  return { index: el.index, name: el.name, id: el.id, ancestors: el.ancestors };
}

function uniqueIds(list: Item[]): Map<string, Item> {
  const seen = new Map<string, Item | null>();
  for (const it of list) {
    if (it.el.id === null) continue;
    seen.set(it.el.id, seen.has(it.el.id) ? null : it);
  }
  const out = new Map<string, Item>();
  for (const [k, v] of seen) if (v !== null) out.set(k, v);
  return out;
}

/** Sample every item into one shape in mm (polylines of all elements together). */
function sampleAll(list: Item[], spacing: number, chord: number): SampledPath {
  const polylines: Float64Array[] = [];
  let errorBound = 0;
  for (const it of list) {
    for (const place of it.places) {
      const s = samplePath(it.path, place, spacing, chord);
      for (const p of s.polylines) polylines.push(p);
      errorBound = Math.max(errorBound, s.errorBound);
    }
  }
  return { polylines, errorBound };
}

function wholeDeviation(ia: Item[], ib: Item[], b: SvgDocument, tol: number): Deviation | null {
  if (ia.length === 0 || ib.length === 0) return null;
  let spacing = tol * SPACING_FACTOR;
  let chord = tol * ERROR_FRACTION;
  let sa = sampleAll(ia, spacing, chord);
  let sb = sampleAll(ib, spacing, chord);
  const total = sampleCount(sa) + sampleCount(sb);
  if (total > DEFAULT_MAX_SAMPLES) {
    // Coarsen as measure.ts does: the bounds stay honest, only looser.
    const f = total / DEFAULT_MAX_SAMPLES;
    spacing *= f;
    chord *= f * f;
    sa = sampleAll(ia, spacing, chord);
    sb = sampleAll(ib, spacing, chord);
  }
  return compareSampled(sa, sb, b.rootToMm, chord);
}

/**
 * Compare two SVG documents (see the module header for pairing and verdict).
 * @param a the reference, e.g. the original
 * @param b the candidate, e.g. a refitted output
 * @throws SvgInputError when either text is not a readable SVG document
 * @throws RangeError for a tolerance that is not a positive number
 */
export function compareSvg(a: string, b: string, opts: CompareOptions): Comparison {
  const tol = opts.tolerance;
  if (!(tol > 0) || !Number.isFinite(tol)) throw new RangeError(`tolerance must be a positive number of mm, got ${tol}`);
  const read = { assumedMmPerUnit: opts.assumedMmPerUnit ?? DEFAULT_OPTIONS.assumedMmPerUnit };
  const da = readSvg(a, read), db = readSvg(b, read);
  const wa = [...da.warnings], wb = [...db.warnings];
  const ia = geometryItems(da, wa), ib = geometryItems(db, wb);
  const pairs: PairDeviation[] = [];
  const used = new Set<Item>();
  const add = (x: Item, y: Item, by: 'id' | 'order'): void => {
    used.add(x).add(y);
    // Every copy is drawn: the pair is measured at each place both draw it (copies pair in order), the worst kept.
    let d: Deviation | null = null;
    const k = Math.max(1, Math.min(x.places.length, y.places.length));
    const { indices, capped } = distinctPlaces(x.places, y.places, k);
    if (capped) wb.push(`<${y.el.name}> (element ${y.el.index}) is drawn in more than ${MAX_PLACES} differently scaled or turned places: measured at the ${MAX_PLACES} drawn largest`);
    for (const i of indices) {
      const di = measureDeviation(x.path, x.places[i] ?? x.el.toMm, y.path, y.places[i] ?? y.el.toMm, tol);
      if (di !== null && (d === null || di.max > d.max)) d = di;
    }
    if (x.places.length !== y.places.length) {
      wb.push(`<${y.el.name}> (element ${y.el.index}) is drawn ${y.places.length} times, its partner in A ${x.places.length} times`);
    }
    // Both draw something (geometryItems filters), so a distance exists; null would be a sampling defect.
    if (d === null) throw new Error(`internal: no distance between <${x.el.name}> ${x.el.index} and <${y.el.name}> ${y.el.index}`);
    pairs.push({ a: ref(x.el), b: ref(y.el), by, deviation: d, withinTolerance: d.max <= tol });
  };
  const idsB = uniqueIds(ib);
  for (const [id, x] of uniqueIds(ia)) {
    const y = idsB.get(id);
    if (y !== undefined) add(x, y, 'id');
  }
  const restA = ia.filter((x) => !used.has(x)), restB = ib.filter((y) => !used.has(y));
  const n = Math.min(restA.length, restB.length);
  for (let i = 0; i < n; i++) add(restA[i], restB[i], 'order');
  pairs.sort((p, q) => p.a.index - q.a.index);
  const unpairedA = restA.slice(n).map((x) => ref(x.el));
  const unpairedB = restB.slice(n).map((y) => ref(y.el));
  const whole = wholeDeviation(ia, ib, db, tol);

  let over = 0, maxPair = 0, pairsOk = true;
  const orderCounts = unpairedA.length === 0 && unpairedB.length === 0;
  for (const p of pairs) {
    maxPair = Math.max(maxPair, p.deviation.max);
    if (!p.withinTolerance) {
      over++;
      if (p.by === 'id' || orderCounts) pairsOk = false;
    }
  }
  // Nothing drawn on both sides is a match; drawn on one side only is not.
  const wholeOk = whole === null ? ia.length === 0 && ib.length === 0 : whole.max <= tol;
  return {
    toleranceMm: tol,
    pairs,
    unpairedA,
    unpairedB,
    whole,
    totals: { pairs: pairs.length, overTolerance: over, maxPairDeviation: maxPair, withinTolerance: wholeOk && pairsOk },
    warnings: [...wa.map((w) => `A: ${w}`), ...wb.map((w) => `B: ${w}`)],
  };
}
