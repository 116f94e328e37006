/**
 * The types of a read document (src/svg/document.ts reads it): the geometry
 * elements with their matrices, source offsets, computed style and copies.
 */
import type { Matrix } from './matrixTypes.js';
import type { ElementStyle } from './style/elementStyle.js';
import type { ClipRect } from './copies.js';

export type { ElementStyle } from './style/elementStyle.js';

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
  /** Document index of the parent element (−1 for none). */
  parent: number;
  /** Namespace prefixes in scope at the element ('' = default namespace) → URI; shared, do not modify. */
  namespaces: Readonly<Record<string, string>>;
  /** True when it is drawn only through `<use>` (it stands in defs or a symbol). */
  drawnByUse: boolean;
  /** Its computed style where it stands (src/svg/style/). */
  style: ElementStyle;
  /** Every copy a drawn `<use>` draws of it (./copies.ts), where it is and how it is styled there. */
  copies: ElementCopy[];
}

/** One copy of a geometry element drawn through `<use>`. */
export interface ElementCopy {
  /** Element user units → root user units, for this copy. */
  ctm: Matrix;
  /** Element user units → millimetres, for this copy. */
  toMm: Matrix;
  /** Its computed style in the copy (inherited from the use, S2 §5.6). */
  style: ElementStyle;
  /** Document index of the use that draws it. */
  use: number;
  /** Viewports (of symbols, svg elements) that clip this copy, innermost first; the rectangles are in the coordinates `toRoot` maps to root user units. */
  clips: ClipRect[];
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
  /** True when `<style>` sheets apply (their rules match by element name, so renaming an element can change its style). */
  styleSheets?: boolean;
}

/** Options for {@link readSvg}. */
export interface ReadOptions {
  /** Millimetres per user unit when the file states no physical size. */
  assumedMmPerUnit: number;
  /** Largest input accepted, characters (default XML_LIMITS.maxInputChars). */
  maxInputChars?: number;
}

