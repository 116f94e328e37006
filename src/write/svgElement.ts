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
import { OP_A, OP_ARGS, OP_L, OP_M, OP_Z, type PathData } from '../svg/pathTypes.js';
import type { FittedElement } from '../model/drawing.js';
import { PathWriter } from './pathWriter.js';
import { formatNumber } from './numbers.js';
import { emitSegments, type EmitStats } from './emit.js';
import { editStartTag, type Edit } from './document.js';
import { parametricAttributes } from './editorAttrs.js';
import { MARK_ATTR, formatMark } from './refitMark.js';

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
  const stats: EmitStats = { arcs: 0, lines: 0, splits: 0, dropped: 0, degenerate: 0, overBound: 0 };
  for (const c of f.contours) {
    if (c.choice === 'original' && c.contour.source) {
      const s = writeSource(sink, c.contour.source.path, digits);
      stats.arcs += s.arcs;
      stats.lines += s.lines;
      continue;
    }
    const s = emitSegments(sink, [{ segments: c.segments, closed: c.contour.closed }], mmToLocal, { digits });
    for (const k of Object.keys(stats) as (keyof EmitStats)[]) stats[k] += s[k];
  }
  // Subpaths that draw a single point (a pierce mark such as `M x y Z`) have no contour; keep them as points.
  const pts = f.element.points;
  for (let i = 0; i < pts.length; i += 2) {
    sink.moveTo(applyX(mmToLocal, pts[i], pts[i + 1]), applyY(mmToLocal, pts[i], pts[i + 1]));
    sink.closePath();
  }
  return { d: sink.toString(), stats };
}

/**
 * True when `v` written with `d` decimals reads back as `v` up to a millionth of the last decimal: a
 * number read from text with at most `d` decimals (relative commands add float sums such as
 * 12.345 + 0.1 = 12.445000000000001, which this forgives).
 */
function holds(v: number, d: number): boolean {
  return Math.abs(Number(formatNumber(v, d)) - v) <= 1e-6 * 10 ** -d;
}

/**
 * Write a kept contour's source subpath as it was read (absolute, exact numbers). Returns the arcs and
 * lines it draws (a Z that draws a closing line is one; Béziers are neither).
 */
function writeSource(sink: PathWriter, p: PathData, digits: number): { arcs: number; lines: number } {
  const letters = ['M', 'L', 'C', 'Q', 'A'] as const;
  let j = 0, arcs = 0, lines = 0, sx = 0, sy = 0, cx = 0, cy = 0;
  for (let i = 0; i < p.ops.length; i++) {
    const op = p.ops[i], n = OP_ARGS[op];
    if (op === OP_Z) {
      sink.closePath();
      if (cx !== sx || cy !== sy) lines++;
      cx = sx;
      cy = sy;
    } else {
      const a = p.args;
      // Numbers that the writer's digits hold exactly go through its usual (shortest) forms; else exact.
      if ((op === OP_M || op === OP_L) && holds(a[j], digits) && holds(a[j + 1], digits)) {
        if (op === OP_M) sink.moveTo(a[j], a[j + 1]);
        else sink.lineTo(a[j], a[j + 1]);
      } else if (op === OP_A && a[j] === a[j + 1] && a[j] > 0 && holds(a[j], digits + 6) && holds(a[j + 5], digits) && holds(a[j + 6], digits)) {
        sink.arcTo(a[j], a[j], 0, a[j + 3] !== 0, a[j + 4] !== 0, a[j + 5], a[j + 6]);
      } else {
        sink.exact(letters[op], a.subarray(j, j + n));
      }
      if (op === OP_L) lines++;
      else if (op === OP_A) arcs++;
      cx = p.args[j + n - 2];
      cy = p.args[j + n - 1];
      if (op === OP_M) {
        sx = cx;
        sy = cy;
      }
    }
    j += n;
  }
  return { arcs, lines };
}

/** The start-tag edits that put `d` on an element, and the editor attributes they drop. */
export function svgElementEdits(
  doc: Pick<SvgDocument, 'text'>, el: GeometryElement, d: string, bakeTransforms: boolean, markMm: number,
): { edits: Edit[]; droppedEditorAttrs: string[] } {
  const set: Record<string, string> = { d, [MARK_ATTR]: formatMark(markMm) };
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
