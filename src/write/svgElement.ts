/**
 * The SVG writer for one fitted element: path data in the element's own (or,
 * baking transforms, the root's) user units, and the byte-preserving edits
 * of its start tag.
 */
import type { GeometryElement, SvgDocument } from '../svg/document.js';
import type { ShapeName } from '../svg/shapes.js';
import { parseTransform } from '../svg/transform.js';
import { applyX, applyY, invert, multiply } from '../svg/matrix.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { FittedElement } from '../model/drawing.js';
import { PathWriter } from './pathWriter.js';
import { emitSegments, type EmitStats } from './emit.js';
import { editStartTag, type Edit } from './document.js';
import { parametricAttributes } from './editorAttrs.js';

/** Attributes a shape loses when it becomes a path. */
export const SHAPE_ATTRS: Readonly<Record<ShapeName, readonly string[]>> = {
  rect: ['x', 'y', 'width', 'height', 'rx', 'ry'],
  circle: ['cx', 'cy', 'r'],
  ellipse: ['cx', 'cy', 'rx', 'ry'],
  line: ['x1', 'y1', 'x2', 'y2'],
  polyline: ['points'],
  polygon: ['points'],
};

/**
 * Path data for a fitted element.
 * @param mmToLocal mm → the user units written
 * @param digits decimals of the written coordinates
 */
export function svgPathData(f: FittedElement, mmToLocal: Matrix, digits: number): { d: string; stats: EmitStats } {
  const sink = new PathWriter({ digits });
  const stats = emitSegments(sink, f.contours.map((c) => ({ segments: c.segments, closed: c.contour.closed })), mmToLocal, { digits });
  // Subpaths that draw a single point (a pierce mark such as `M x y Z`) have no contour; keep them as points.
  const pts = f.element.points;
  for (let i = 0; i < pts.length; i += 2) {
    sink.moveTo(applyX(mmToLocal, pts[i], pts[i + 1]), applyY(mmToLocal, pts[i], pts[i + 1]));
    sink.closePath();
  }
  return { d: sink.toString(), stats };
}

/** The start-tag edits that put `d` on an element, and the editor attributes they drop. */
export function svgElementEdits(
  doc: Pick<SvgDocument, 'text'>, el: GeometryElement, d: string, bakeTransforms: boolean,
): { edits: Edit[]; droppedEditorAttrs: string[] } {
  const set: Record<string, string> = { d };
  const remove: string[] = el.name === 'path' ? [] : SHAPE_ATTRS[el.name].filter((a) => a in el.attrs);
  const dropped = parametricAttributes(el.attrs, el.namespaces);
  remove.push(...dropped);
  if (bakeTransforms) {
    // Coordinates are now root user units: undo the ancestors' transforms instead of applying the element's own.
    const own = parseTransform(el.attrs.transform ?? '').matrix;
    const ownInv = invert(new Float64Array(6), own) ?? own;
    const ancestors = multiply(new Float64Array(6), el.ctm, ownInv);
    const undo = invert(new Float64Array(6), ancestors);
    if (undo && !isIdentity(undo)) set.transform = `matrix(${Array.from(undo, (v) => +v.toPrecision(12)).join(' ')})`;
    else if ('transform' in el.attrs) remove.push('transform');
  }
  const edits = editStartTag(doc.text, el, { rename: el.name === 'path' ? undefined : 'path', set, remove });
  return { edits, droppedEditorAttrs: dropped };
}

function isIdentity(m: Matrix): boolean {
  const e = 1e-12;
  return Math.abs(m[0] - 1) < e && Math.abs(m[1]) < e && Math.abs(m[2]) < e && Math.abs(m[3] - 1) < e && Math.abs(m[4]) < e && Math.abs(m[5]) < e;
}
