/**
 * Read an SVG document into the list of its geometry elements, each with the
 * matrices that place it in millimetres and the source offsets of its tags,
 * so that the splice writer (src/write/document.ts) can rewrite exactly those
 * bytes and leave the rest of the file alone.
 *
 * saxes does the XML parsing (strict); this module only listens to its events
 * and keeps a stack of open elements (parallel arrays, no DOM, no recursion:
 * 100 000 nested groups are fine). Namespaces are resolved here, not by
 * saxes: its `xmlns: true` mode takes time quadratic in nesting depth
 * (measured: 20 000 nested groups 4.4 s vs 0.05 s without it), so we keep
 * one prefix → URI table per depth, copied only where an element declares
 * `xmlns` attributes.
 *
 * Decisions where the standards leave a choice:
 * - The root must be `svg` in the SVG namespace, or `svg` with no namespace at
 *   all (hand-written files often omit xmlns; a warning says so, and then
 *   un-namespaced descendants count as SVG too).
 * - `<use>` is not expanded: what it references is rewritten where it stands
 *   (if it stands in rendered content), which changes every copy alike; each
 *   element's `copyScale` (./copies.ts) says how much larger a copy may draw
 *   it, so the refit can keep every copy within the tolerance.
 * - A `transform` on the root `<svg>` acts as if on a parent of it (S2 §8.6),
 *   so it is folded into `rootToMm`, not into the elements' `ctm`.
 * - CSS is not applied: `transform` or `display` set by a `style` attribute
 *   or a `<style>` sheet is not seen (a warning says so). `display="none"`
 *   (attribute, or `display:none` in a style attribute) is honoured.
 * - Nested `<svg>` clipping (overflow) is ignored; only its coordinate system
 *   (x, y, width, height, viewBox, preserveAspectRatio, S2 §8.2/§8.8) is used.
 * - Not rewritable (left untouched, with a reason): geometry under defs,
 *   clipPath, mask, symbol, pattern, marker and other never-rendered
 *   containers, under an element in a foreign namespace, inside a
 *   non-container (e.g. a path inside <text>), with `display="none"` on it or
 *   an ancestor, with an invalid `transform` on it or an ancestor, or with a
 *   singular CTM (CT1: not displayed).
 */
import { SaxesParser, type SaxesTagPlain } from 'saxes';
import type { Matrix } from './matrixTypes.js';
import { determinant, identityMatrix, matrix, multiply } from './matrix.js';
import { parseTransform } from './transform.js';
import { lengthToUser, mmPerPx } from './units.js';
import { parsePreserveAspectRatio, parseViewBox, rootToMm, viewBoxTransform } from './viewport.js';
import { errorAt, SvgInputError } from './errors.js';
import { createEntityGuard, XML_LIMITS } from './xmlSafety.js';
import { CopyRecorder, MAX_CHAIN } from './copies.js';
import { declaredStyle } from './presentation.js';

/** The SVG namespace URI. */
export const SVG_NS = 'http://www.w3.org/2000/svg';

/** Element names whose geometry arcspline reads and may rewrite. */
export type GeometryName = 'path' | 'rect' | 'circle' | 'ellipse' | 'line' | 'polyline' | 'polygon';

/** One geometry element as found in the source. */
export interface GeometryElement {
  /** Document order among all elements, the root svg being 0. */
  index: number;
  /** Local name (a prefix such as `svg:` is not part of it). */
  name: GeometryName;
  id: string | null;
  /** Ancestors by qualified name and #id, root first, e.g. "svg > g#layer1 > g"; deeper than 24 levels the middle is shown as "…". */
  ancestors: string;
  /** Attribute values by qualified name, as the XML parser decoded them (entities resolved). */
  attrs: Record<string, string>;
  /** Element user units → root user units, including the element's own transform. */
  ctm: Matrix;
  /** Element user units → millimetres: `rootToMm · ctm`. */
  toMm: Matrix;
  /** Size of the nearest viewport in the element's user units (before its own transform), for percentages. */
  viewportW: number;
  viewportH: number;
  /** String indices into `text` of the start tag's `<` and just after its `>`. */
  startTag: [number, number];
  /** The same for the end tag, or null for a self-closing element. */
  endTag: [number, number] | null;
  /** False when the element must be left untouched; `reason` says why. */
  rewritable: boolean;
  reason: string | null;
  /** Most a copy drawn by `<use>` enlarges it, in mm (1 when it has no larger copy; ./copies.ts). */
  copyScale: number;
  /** Id of the nearest ancestor `<g>` that has one (a layer or group), or null. */
  group: string | null;
  /** Namespace prefixes in scope at the element ('' = default namespace) → URI; shared, do not modify. */
  namespaces: Readonly<Record<string, string>>;
  /** stroke, fill and stroke-width as its ancestors set them (./presentation.ts); shared, do not modify. */
  inheritedStyle: Readonly<Record<string, string>>;
}

/** A read document: the original text and what we found in it. */
export interface SvgDocument {
  /** The input, unchanged (a BOM, if any, is kept; offsets index this string). */
  text: string;
  elements: GeometryElement[];
  /** Root user units → millimetres, the root's own transform included. */
  rootToMm: Matrix;
  /** True when the root's width/height state a physical size. */
  physicalSize: boolean;
  /** The page (the root viewport) in mm, width and height (machine output puts its origin at a page corner). */
  pageMm: [number, number];
  warnings: string[];
}

/** Options for {@link readSvg}. */
export interface ReadOptions {
  /** Millimetres per user unit when the file states no physical size. */
  assumedMmPerUnit: number;
  /** Largest input accepted, characters (default XML_LIMITS.maxInputChars). */
  maxInputChars?: number;
}

const GEOMETRY = new Set<string>(['path', 'rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon']);
/** Children of these may be rendered in place. */
const CONTAINERS = new Set<string>(['svg', 'g', 'a', 'switch']);
/** Containers whose content is never rendered where it stands (S2 ch. 5, 11, 13, 14). */
const NEVER_RENDERED = new Set<string>([
  'defs', 'clipPath', 'mask', 'symbol', 'pattern', 'marker', 'metadata', 'title', 'desc',
  'style', 'script', 'foreignObject', 'linearGradient', 'radialGradient', 'filter',
]);
const DISPLAY_NONE_STYLE = /(?:^|;)\s*display\s*:\s*none\s*(?:!important\s*)?(?:;|$)/i;
const MAX_DEPTH = 1_000_000;
const XML_NS = 'http://www.w3.org/XML/1998/namespace';
const ANCESTOR_LEVELS = 24;

/**
 * Parse `text` (a whole SVG document) and list its geometry elements.
 * @throws SvgInputError for malformed XML, a root other than `<svg>`, or
 *   XML the safety rules (REFERENCES.md §7, src/svg/xmlSafety.ts) refuse.
 */
export function readSvg(text: string, opts: ReadOptions): SvgDocument {
  const parser = new SaxesParser({ xmlns: false });
  // saxes skips a leading BOM itself and counts it in `position`, so every
  // offset below is an index into the original `text`.
  const limits = opts.maxInputChars === undefined ? XML_LIMITS : { ...XML_LIMITS, maxInputChars: opts.maxInputChars };
  const guard = createEntityGuard(text, () => parser.position, limits);
  parser.ENTITIES = guard.table;
  const warnings: string[] = [];
  const elements: GeometryElement[] = [];

  // The open-element stack, as parallel arrays indexed by depth.
  const ctmStack: Matrix[] = [];
  const vpW: number[] = [];
  const vpH: number[] = [];
  /** Why children of this element are not rewritable, or null. */
  const childReason: (string | null)[] = [];
  const labels: string[] = [];
  /** Index into `elements` for an open geometry element, else -1. */
  const geomAt: number[] = [];
  /** Namespace bindings in scope at each depth ('' = default namespace); shared with the parent unless changed. */
  const nsStack: Record<string, string>[] = [];
  /** Id of the nearest `<g>` with an id at or above each depth. */
  const groupStack: (string | null)[] = [];
  /** Inherited drawing properties at each depth (shared with the parent unless the element declares one). */
  const styleStack: Readonly<Record<string, string>>[] = [];
  const NO_STYLE: Readonly<Record<string, string>> = Object.freeze({});
  const rootNs = Object.assign(Object.create(null) as Record<string, string>, { xml: XML_NS, '': '' });
  let depth = 0;
  let count = 0;
  const copies = new CopyRecorder();
  let noNamespaceIsSvg = false;
  let docRootToMm: Matrix = identityMatrix();
  let physical = false;
  let pageMm: [number, number] = [0, 0];
  let sawStyleTransform = false;

  parser.on('error', (e: Error) => {
    const msg = e.message.replace(/^(?:[^:]*:)?\d+:\d+: /, '').replace(/\.$/, '');
    throw errorAt(text, Math.max(0, parser.position - 1), 'XML error', msg);
  });
  parser.on('doctype', (contents: string) => {
    guard.doctype(contents, Math.max(0, text.lastIndexOf('<!DOCTYPE', parser.position)));
  });
  parser.on('processinginstruction', (pi) => {
    if (pi.target === 'xml-stylesheet') warnings.push('xml-stylesheet ignored (never fetched; CSS is not applied)');
  });

  parser.on('opentag', (tag: SaxesTagPlain) => {
    const end = parser.position;
    // No '<' can occur inside a start tag (XML 1.0 [10] AttValue), so the last one before '>' opens it.
    const start = text.lastIndexOf('<', end - 1);
    const index = count++;
    const at = tag.attributes;
    const parentNs = depth > 0 ? nsStack[depth - 1] : rootNs;
    let ns = parentNs;
    for (const k in at) {
      if (k === 'xmlns' || k.startsWith('xmlns:')) {
        if (ns === parentNs) ns = Object.assign(Object.create(null) as Record<string, string>, parentNs);
        ns[k === 'xmlns' ? '' : k.slice(6)] = at[k];
      }
    }
    const colon = tag.name.indexOf(':');
    const local = colon < 0 ? tag.name : tag.name.slice(colon + 1);
    const uri = ns[colon < 0 ? '' : tag.name.slice(0, colon)];
    if (uri === undefined) throw errorAt(text, start, 'XML error', `unbound namespace prefix in <${tag.name}>`);
    if (depth >= MAX_DEPTH) throw errorAt(text, start, 'XML error', `elements nested deeper than ${MAX_DEPTH}`);
    if (depth === 0) {
      if (local !== 'svg' || (uri !== SVG_NS && uri !== '')) {
        throw errorAt(text, start, 'not an SVG document', `root element is <${tag.name}>${uri ? ` in namespace ${uri}` : ''}`);
      }
      if (uri === '') {
        noNamespaceIsSvg = true;
        warnings.push(`root <svg> has no xmlns="${SVG_NS}"; read as SVG anyway`);
      }
    }
    const isSvg = uri === SVG_NS || (uri === '' && noNamespaceIsSvg);
    const id = at.id ?? null;
    const label = id !== null ? `${tag.name}#${id}` : tag.name;
    const parentCtm = depth > 0 ? ctmStack[depth - 1] : null;
    let reason: string | null = depth > 0 ? childReason[depth - 1] : null;
    let ctm: Matrix = parentCtm ?? identityMatrix();
    let w = depth > 0 ? vpW[depth - 1] : 0;
    let h = depth > 0 ? vpH[depth - 1] : 0;

    const style = at.style;
    if (style !== undefined && !sawStyleTransform && /(?:^|;)\s*transform\s*:/i.test(style)) {
      sawStyleTransform = true;
      warnings.push(`a CSS transform in a style attribute (first on <${label}>) is ignored`);
    }
    if (isSvg && reason === null) {
      if (at.display?.trim() === 'none' || (style !== undefined && DISPLAY_NONE_STYLE.test(style))) {
        reason = `display="none" on <${label}>`;
      }
    }
    let own: Matrix | null = null;
    const tf = at.transform;
    if (tf !== undefined && isSvg) {
      const p = parseTransform(tf);
      if (p.error !== null) {
        reason ??= `invalid transform on <${label}>: ${p.error}`;
      } else {
        own = p.matrix;
      }
    }

    if (depth === 0) {
      const frame = rootToMm(at.width, at.height, at.viewBox, at.preserveAspectRatio, opts.assumedMmPerUnit);
      physical = frame.physical;
      pageMm = frame.pageMm;
      w = frame.viewportW;
      h = frame.viewportH;
      if (frame.warning !== null) warnings.push(frame.warning);
      docRootToMm = frame.matrix;
      if (own !== null) {
        // S2 §8.6: the root's transform acts in the parent (viewport) space, before px → mm.
        // rootToMm is (uniform scale s)·(viewBox map), so s·T·viewBox = (s·T·s⁻¹)·rootToMm.
        const s = physical ? mmPerPx : opts.assumedMmPerUnit;
        const conj = matrix(own[0], own[1], own[2], own[3], own[4] * s, own[5] * s);
        docRootToMm = multiply(matrix(0, 0, 0, 0, 0, 0), conj, docRootToMm);
      }
    } else {
      if (own !== null) ctm = multiply(new Float64Array(6), ctm, own);
      if (isSvg && local === 'svg') {
        // S2 §8.8: a nested viewport, placed in the parent's user units.
        const x = lengthToUser(at.x, w, 0);
        const y = lengthToUser(at.y, h, 0);
        const ew = lengthToUser(at.width, w, w);
        const eh = lengthToUser(at.height, h, h);
        const vb = at.viewBox !== undefined ? parseViewBox(at.viewBox) : null;
        if (!(ew > 0 && eh > 0)) reason ??= `nested <${label}> has no area (not rendered)`;
        const vm = vb !== null
          ? viewBoxTransform(vb, parsePreserveAspectRatio(at.preserveAspectRatio), x, y, ew, eh)
          : matrix(1, 0, 0, 1, x, y);
        ctm = multiply(new Float64Array(6), ctm, vm);
        w = vb !== null ? vb[2] : ew;
        h = vb !== null ? vb[3] : eh;
      }
    }
    if (ctm !== parentCtm && reason === null) {
      const det = determinant(depth === 0 ? docRootToMm : ctm);
      if (!(det !== 0 && Number.isFinite(det))) reason = `singular transform at <${label}> (not displayed)`;
    }

    let g = -1;
    if (isSvg && GEOMETRY.has(local)) {
      const attrs: Record<string, string> = { ...at };
      g = elements.length;
      elements.push({
        index,
        name: local as GeometryName,
        id,
        ancestors: ancestorsOf(labels, depth),
        attrs,
        ctm: ctm.slice(),
        toMm: multiply(new Float64Array(6), docRootToMm, ctm),
        viewportW: w,
        viewportH: h,
        startTag: [start, end],
        endTag: null,
        rewritable: reason === null,
        reason,
        copyScale: 1,
        group: depth > 0 ? groupStack[depth - 1] : null,
        namespaces: ns,
        inheritedStyle: depth > 0 ? styleStack[depth - 1] : NO_STYLE,
      });
    }
    copies.open(index, depth, isSvg ? local : null, id, at, ctm, parentCtm, ns, w, h);
    let forChildren = reason;
    if (forChildren === null) {
      if (!isSvg) forChildren = `inside <${label}> (not SVG)`;
      else if (NEVER_RENDERED.has(local)) forChildren = `inside <${label}> (not rendered in place)`;
      else if (!CONTAINERS.has(local)) forChildren = `inside <${label}> (not a container)`;
    }
    if (isSvg && local === 'style') warnings.push('a <style> sheet is ignored (CSS is not applied)');
    ctmStack[depth] = ctm;
    vpW[depth] = w;
    vpH[depth] = h;
    childReason[depth] = forChildren;
    labels[depth] = label;
    geomAt[depth] = g;
    nsStack[depth] = ns;
    groupStack[depth] = isSvg && local === 'g' && id !== null ? id : depth > 0 ? groupStack[depth - 1] : null;
    const parentStyle = depth > 0 ? styleStack[depth - 1] : NO_STYLE;
    const ownStyle = isSvg ? declaredStyle(at) : null;
    styleStack[depth] = ownStyle ? { ...parentStyle, ...ownStyle } : parentStyle;
    depth++;
  });

  parser.on('closetag', (tag: SaxesTagPlain) => {
    depth--;
    copies.close(depth, count - 1);
    const g = geomAt[depth];
    if (g >= 0 && !tag.isSelfClosing) {
      const end = parser.position;
      elements[g].endTag = [text.lastIndexOf('</', end - 1), end];
    }
  });

  try {
    parser.write(text).close();
  } catch (e) {
    if (e instanceof SvgInputError) throw e;
    throw new SvgInputError(`XML error: ${(e as Error).message}`);
  }
  const scales = copies.scales(elements.map((e) => e.index), docRootToMm);
  elements.forEach((e, i) => {
    e.copyScale = scales[i];
    if (!Number.isFinite(scales[i]) && e.rewritable) {
      e.rewritable = false;
      e.reason = `drawn again by <use> at a scale that cannot be bounded (a cycle of uses, a chain of more than ${MAX_CHAIN}, or a resized nested <svg>)`;
    }
  });
  return { text, elements, rootToMm: docRootToMm, physicalSize: physical, pageMm, warnings: [...guard.warnings, ...warnings] };
}

/** "svg > g#a > g" for the first `depth` labels, eliding the middle of a deep chain. */
function ancestorsOf(labels: string[], depth: number): string {
  if (depth <= ANCESTOR_LEVELS) return labels.slice(0, depth).join(' > ');
  return `${labels[0]} > … > ${labels.slice(depth - (ANCESTOR_LEVELS - 1), depth).join(' > ')}`;
}
