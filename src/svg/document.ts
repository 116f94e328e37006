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
 * - Styles are computed by the CSS cascade (src/svg/style/): presentation
 *   attributes, `<style>` sheets anywhere in the document, the `style`
 *   attribute, `!important`, inheritance. A document with a sheet is read
 *   twice: the first pass collects the sheets and the element table their
 *   selectors are matched against, the second computes. `display: none`
 *   from any origin, and `visibility: hidden` on the element itself, leave
 *   the geometry as written with the reason; a CSS `transform` is part of the
 *   element's matrix.
 * - Nested `<svg>` clipping (overflow) is ignored; only its coordinate system
 *   (x, y, width, height, viewBox, preserveAspectRatio, S2 §8.2/§8.8) is used.
 * - Not rewritable (left untouched, with a reason): geometry under clipPath,
 *   mask, pattern, marker and other never-rendered containers, and under defs
 *   or symbol unless a drawn `<use>` draws it (./copies.ts), under an element in a foreign namespace, inside a
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
import { CopyRecorder } from './copies.js';
import { NO_COPIES, placeCopies } from './reuse.js';
import { computeStyle, ROOT_PARENT, type Computed } from './style/cascade.js';
import { parseCssTransform, parseTransformOrigin } from './style/cssTransform.js';
import { elementStyle } from './style/elementStyle.js';
import { SVG_NS, type GeometryElement, type GeometryName, type ReadOptions, type SvgDocument } from './documentTypes.js';
import { matchRules } from './style/match.js';
import { parseSheets, parseStyleAttribute, type Decl } from './style/sheet.js';
import type { ElementTable } from './style/selectors.js';

export type { ElementStyle } from './style/elementStyle.js';

export { SVG_NS } from './documentTypes.js';
export type { GeometryName, GeometryElement, ElementCopy, SvgDocument, ReadOptions } from './documentTypes.js';

const GEOMETRY = new Set<string>(['path', 'rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon']);
/** Children of these may be rendered in place. */
const CONTAINERS = new Set<string>(['svg', 'g', 'a', 'switch']);
/** Containers whose content is never rendered where it stands (S2 ch. 5, 11, 13, 14). */
const NEVER_RENDERED = new Set<string>([
  'defs', 'clipPath', 'mask', 'symbol', 'pattern', 'marker', 'metadata', 'title', 'desc',
  'style', 'script', 'foreignObject', 'linearGradient', 'radialGradient', 'filter',
]);
/** Never-rendered containers whose content a `<use>` may draw (S2 §5.3, §5.5): geometry there is refitted when drawn. */
const REUSABLE = new Set<string>(['defs', 'symbol']);
/** `<style>` types that are CSS (S2 §6.3: absent or empty means text/css). */
const CSS_TYPE = /^\s*(?:text\/css)?\s*(?:;.*)?$/i;
const MAX_DEPTH = 1_000_000;
const XML_NS = 'http://www.w3.org/XML/1998/namespace';
const ANCESTOR_LEVELS = 24;

/**
 * Parse `text` (a whole SVG document) and list its geometry elements.
 * @throws SvgInputError for malformed XML, a root other than `<svg>`, XML
 *   the safety rules (REFERENCES.md §7, src/svg/xmlSafety.ts) refuse, or
 *   style sheets over the caps (src/svg/style/sheet.ts STYLE_LIMITS).
 */
export function readSvg(text: string, opts: ReadOptions): SvgDocument {
  const first = readPass(text, opts, null);
  if (first.sheets.length === 0) return first.doc;
  first.doc.styleSheets = true;
  // Sheets apply to the whole document wherever they stand: match them against the table of the first pass, then read again.
  const notes = new Set<string>();
  const rules = parseSheets(first.sheets, notes);
  const matched = matchRules(first.table, rules, notes);
  const second = readPass(text, opts, matched);
  second.doc.warnings.push(...notes);
  second.doc.styleSheets = true;
  return second.doc;
}

interface Pass {
  doc: SvgDocument;
  /** Text of the CSS `<style>` sheets, in document order. */
  sheets: string[];
  table: ElementTable;
}

/** One reading of the document; `matched` gives each element's sheet declarations (null: no sheets known). */
function readPass(text: string, opts: ReadOptions, matched: (Decl[] | undefined)[] | null): Pass {
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
  const rootNs = Object.assign(Object.create(null) as Record<string, string>, { xml: XML_NS, '': '' });
  let depth = 0;
  let count = 0;
  const copies = new CopyRecorder();
  let noNamespaceIsSvg = false;
  let docRootToMm: Matrix = identityMatrix();
  let physical = false;
  let pageMm: [number, number] = [0, 0];
  const notes = new Set<string>();
  const styleStack: Computed[] = [];
  /** Deepest depth at or above each open element whose reason a `<use>` cannot lift (−1: none); see ./copies.ts. */
  const blockAt: number[] = [];
  const sheets: string[] = [];
  /** Depth of the open CSS `<style>` element, or −1. */
  let inSheet = -1;
  const table = { parent: [] as number[], name: [] as string[], attrs: [] as Record<string, string>[] };
  const indexAt: number[] = [];
  const useStyle = new Map<number, Computed>();
  // Percentages in a CSS transform refer to the nearest viewport (read by the checker below).
  let boxW = 0, boxH = 0;
  const cssTransformOk = (v: string): boolean => {
    const r = parseCssTransform(v, boxW, boxH);
    if (r.error !== null) notes.add(`CSS transform ignored: ${r.error}`);
    return r.error === null;
  };

  parser.on('error', (e: Error) => {
    const msg = e.message.replace(/^(?:[^:]*:)?\d+:\d+: /, '').replace(/\.$/, '');
    throw errorAt(text, Math.max(0, parser.position - 1), 'XML error', msg);
  });
  parser.on('doctype', (contents: string) => {
    guard.doctype(contents, Math.max(0, text.lastIndexOf('<!DOCTYPE', parser.position)));
  });
  parser.on('processinginstruction', (pi) => {
    if (pi.target === 'xml-stylesheet') notes.add('xml-stylesheet ignored (an external style sheet is never fetched)');
  });
  parser.on('text', (t: string) => { if (inSheet >= 0) sheets[sheets.length - 1] += t; });
  parser.on('cdata', (t: string) => { if (inSheet >= 0) sheets[sheets.length - 1] += t; });

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

    table.parent[index] = depth > 0 ? indexAt[depth - 1] : -1;
    table.name[index] = local;
    table.attrs[index] = at;
    indexAt[depth] = index;
    const parentStyle = depth > 0 ? styleStack[depth - 1] : ROOT_PARENT;
    boxW = w;
    boxH = h;
    const computed = isSvg
      ? computeStyle(parentStyle, at, matched?.[index], at.style !== undefined ? parseStyleAttribute(at.style, notes) : null, cssTransformOk)
      : computeStyle(parentStyle, NO_ATTRS, undefined, null, cssTransformOk);
    let block = depth > 0 ? blockAt[depth - 1] : -1;
    // Set when something on this element itself keeps it from being drawn, even under an inherited reason (a use of an ancestor would not lift it).
    let ownBlock = false;
    if (isSvg && computed.values.display === 'none') {
      ownBlock = true;
      reason ??= `display: none on <${label}>`;
    }
    let own: Matrix | null = null;
    const tf = computed.values.transform;
    if (tf !== 'none' && isSvg) {
      if (computed.transformIsCss) {
        own = parseCssTransform(tf, w, h).matrix; // checked valid by the cascade
      } else {
        const p = parseTransform(tf);
        if (p.error !== null) {
          ownBlock = true;
          reason ??= `invalid transform on <${label}>: ${p.error}`;
        }
        else own = p.matrix;
      }
      const origin = computed.values['transform-origin'];
      if (own !== null && origin !== '0 0') {
        // CT1 §8.1: the transform acts about the origin: translate(o) · T · translate(−o).
        const o = parseTransformOrigin(origin, w, h);
        if (o === null) notes.add(`transform-origin "${origin.slice(0, 60)}" not understood (on <${label}>); 0 0 used`);
        else own = multiply(new Float64Array(6), multiply(new Float64Array(6), matrix(1, 0, 0, 1, o[0], o[1]), own), matrix(1, 0, 0, 1, -o[0], -o[1]));
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
        if (!(ew > 0 && eh > 0)) {
          ownBlock = true;
          reason ??= `nested <${label}> has no area (not rendered)`;
        }
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
      if (!(det !== 0 && Number.isFinite(det))) {
        ownBlock = true;
        reason = `singular transform at <${label}> (not displayed)`;
      }
    }

    let g = -1;
    if (isSvg && GEOMETRY.has(local)) {
      // Not painted where it stands (S2 §13.3; inherited, so a child may show again): kept as written.
      if (computed.values.visibility !== 'visible') {
        ownBlock = true;
        reason ??= `visibility: ${computed.values.visibility} on <${label}> (not painted)`;
      }
    }
    // A reason arising here that a <use> drawing this element or an ancestor would not lift (only defs and symbol are lifted).
    if (ownBlock) block = depth;
    if (isSvg && GEOMETRY.has(local)) {
      const attrs: Record<string, string> = { ...at };
      const toMm = multiply(new Float64Array(6), docRootToMm, ctm);
      g = elements.length;
      elements.push({
        index,
        name: local as GeometryName,
        id,
        ancestors: ancestorsOf(labels, depth),
        attrs,
        ctm: ctm.slice(),
        toMm,
        viewportW: w,
        viewportH: h,
        startTag: [start, end],
        endTag: null,
        rewritable: reason === null,
        reason,
        copyScale: 1,
        group: depth > 0 ? groupStack[depth - 1] : null,
        parent: depth > 0 ? indexAt[depth - 1] : -1,
        namespaces: ns,
        drawnByUse: false,
        style: elementStyle(computed, toMm, docRootToMm, w, h),
        copies: NO_COPIES,
      });
    }
    const ov = computed.values.overflow;
    copies.open(index, depth, isSvg ? local : null, id, at, ctm, parentCtm, ns, w, h, own, ov === 'hidden' || ov === 'scroll' || ov === 'clip');
    copies.state(index, block, reason === null);
    let forChildren = reason;
    if (forChildren === null) {
      if (!isSvg) forChildren = `inside <${label}> (not SVG)`;
      else if (NEVER_RENDERED.has(local)) forChildren = `inside <${label}> (not rendered in place)`;
      else if (!CONTAINERS.has(local)) forChildren = `inside <${label}> (not a container)`;
      if (forChildren !== null && !(isSvg && REUSABLE.has(local))) block = depth;
    }
    if (isSvg && local === 'style') {
      if (CSS_TYPE.test(at.type ?? '')) {
        inSheet = depth;
        sheets.push('');
      } else {
        notes.add(`a <style> of type "${at.type}" is not CSS and is not applied`);
      }
    }
    ctmStack[depth] = ctm;
    styleStack[depth] = computed;
    if (isSvg && local === 'use') useStyle.set(index, computed);
    blockAt[depth] = block;
    vpW[depth] = w;
    vpH[depth] = h;
    childReason[depth] = forChildren;
    labels[depth] = label;
    geomAt[depth] = g;
    nsStack[depth] = ns;
    groupStack[depth] = isSvg && local === 'g' && id !== null ? id : depth > 0 ? groupStack[depth - 1] : null;
    depth++;
  });

  parser.on('closetag', (tag: SaxesTagPlain) => {
    depth--;
    if (depth === inSheet) inSheet = -1;
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
  // The cascade again for a copy: from the target down, inheriting from the use (S2 §5.6).
  const restyle = (pos: number, parent: Computed): Computed => {
    const at = table.attrs[pos];
    return computeStyle(parent, at, matched?.[pos], at.style !== undefined ? parseStyleAttribute(at.style, notes) : null, cssTransformOk);
  };
  const many = placeCopies(elements, copies, { parent: table.parent, useStyle, restyle }, docRootToMm);
  if (many !== null) notes.add(many);
  const doc = { text, elements, rootToMm: docRootToMm, physicalSize: physical, pageMm, warnings: [...guard.warnings, ...warnings, ...notes] };
  return { doc, sheets, table };
}

const NO_ATTRS: Record<string, string> = Object.freeze({}) as Record<string, string>;

/** "svg > g#a > g" for the first `depth` labels, eliding the middle of a deep chain. */
function ancestorsOf(labels: string[], depth: number): string {
  if (depth <= ANCESTOR_LEVELS) return labels.slice(0, depth).join(' > ');
  return `${labels[0]} > … > ${labels.slice(depth - (ANCESTOR_LEVELS - 1), depth).join(' > ')}`;
}
