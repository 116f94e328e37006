/**
 * Read a written machine file back with general-purpose readers from the npm
 * registry (not our writers' code) and rebuild what the machine would draw, in
 * machine mm, element by element:
 * - G-code: gcode-toolpath (on gcode-parser and gcode-interpreter) runs the
 *   modal state (units, distance mode, plane, motion mode) and hands each move
 *   with its end points and, for G2/G3, the centre it computed from I, J. The
 *   moves that draw are the G1/G2/G3 moves that change X or Y (NIST: G0 is
 *   travel, "no cutting expected"). An element starts at our `(element N …)`
 *   comment, as the reader reports it.
 * - DXF: dxf-parser; LINE and ARC entities (angles in radians from the
 *   reader, counter-clockwise from start to end). Which entities draw which
 *   element comes from the writer's spans, in file order.
 *
 * Arcs are sampled from the reader's centre, start and end: the angle runs
 * from start to end in the G2/G3 sense (equal ends: a full turn, NIST
 * §3.5.3.2), the radius from the start radius to the end radius linearly in
 * the angle (an interpreter accepts radii that differ by 0.002 mm). Chord
 * error: for p(θ) = c + r(θ)·u(θ) with r linear, |p''| ≤ r_max + 2|r'|, so a
 * step h keeps every chord within h²·(r_max + 2|r'|)/8 of the curve.
 */
import { createRequire } from 'node:module';
import type Toolpath from 'gcode-toolpath';
import type { DxfSpan } from '../write/dxf.js';
import { machineKey } from './drawing.js';

// The readers load on first use (both are CommonJS), so `import 'arcspline'` does not pay for them (7 ms, median of 9 runs).
const requireCjs = createRequire(import.meta.url);
let toolpathClass: typeof Toolpath | null = null;
let dxfParserClass: (new () => { parseSync(text: string): unknown }) | null = null;
const ToolpathReader = (): typeof Toolpath => (toolpathClass ??= requireCjs('gcode-toolpath') as typeof Toolpath);
/** The DXF reader's class: its CommonJS build exports the class itself. */
const DxfReader = (): new () => { parseSync(text: string): unknown } =>
  (dxfParserClass ??= requireCjs('dxf-parser') as new () => { parseSync(text: string): unknown });

/** What the reader rebuilt for one element: polylines in machine mm. */
export interface ReadElement {
  polylines: Float64Array[];
}

/** The read-back of a whole file. */
export interface ReadBack {
  /** By machine key (./drawing.ts machineKey: the element index, a copy's with a fraction); −1 collects work moves outside any element. */
  elements: Map<number, ReadElement>;
  /** mm: every chord is within this of the curve it stands for (lines are exact). */
  errorBound: number;
  /** mm: largest difference between an arc's start and end radius (G-code; 0 for DXF). */
  radiusMismatch: number;
  /** Drawing moves the reader found (lines and arcs). */
  moves: number;
  /** Header facts a reader reported (DXF: $INSUNITS), for checks. */
  units: number | null;
}

const TWO_PI = 2 * Math.PI;


function target(els: Map<number, ReadElement>, index: number): ReadElement {
  let e = els.get(index);
  if (!e) els.set(index, (e = { polylines: [] }));
  return e;
}

/** A straight piece cut into chords at most `spacing` long (the measurement's grid wants short segments). */
function linePoints(x0: number, y0: number, x1: number, y1: number, spacing: number): Float64Array {
  const k = Math.max(1, Math.ceil(Math.hypot(x1 - x0, y1 - y0) / spacing));
  const out = new Float64Array(2 * (k + 1));
  for (let i = 0; i <= k; i++) {
    out[2 * i] = x0 + ((x1 - x0) * i) / k;
    out[2 * i + 1] = y0 + ((y1 - y0) * i) / k;
  }
  return out;
}

/**
 * Points of an arc from (x0, y0) to (x1, y1) about (cx, cy), turning by `sweep`
 * radians (signed, + = counter-clockwise), radius linear in the angle.
 */
export function arcPoints(x0: number, y0: number, x1: number, y1: number, cx: number, cy: number, sweep: number, chord: number, spacing: number): Float64Array {
  const r0 = Math.hypot(x0 - cx, y0 - cy), r1 = Math.hypot(x1 - cx, y1 - cy);
  const a0 = Math.atan2(y0 - cy, x0 - cx);
  const rMax = Math.max(r0, r1), dr = Math.abs(r1 - r0) / Math.max(Math.abs(sweep), 1e-12);
  const hChord = Math.sqrt((8 * chord) / (rMax + 2 * dr));
  const hSpace = spacing / Math.max(rMax, 1e-12);
  const k = Math.max(1, Math.ceil(Math.abs(sweep) / Math.min(hChord, hSpace)));
  if (k > 50_000_000) throw new RangeError(`an arc of radius ${rMax} mm needs ${k} samples`);
  const out = new Float64Array(2 * (k + 1));
  for (let i = 0; i <= k; i++) {
    const t = i / k, a = a0 + sweep * t, r = r0 + (r1 - r0) * t;
    out[2 * i] = cx + r * Math.cos(a);
    out[2 * i + 1] = cy + r * Math.sin(a);
  }
  out[0] = x0;
  out[1] = y0;
  out[2 * k] = x1;
  out[2 * k + 1] = y1;
  return out;
}

/** Signed sweep from start angle to end angle in one sense; equal angles are a full turn. */
function sweepOf(a0: number, a1: number, ccw: boolean): number {
  let s = ccw ? a1 - a0 : a0 - a1;
  s = ((s % TWO_PI) + TWO_PI) % TWO_PI;
  if (s === 0) s = TWO_PI;
  return ccw ? s : -s;
}

const ELEMENT_COMMENT = /^element (\d+)(?: copy (\d+))?\b/;

/**
 * Read G-code back.
 * @param chord mm, chord error allowed when sampling arcs
 * @param spacing mm, longest chord
 */
export function readBackGcode(text: string, chord: number, spacing: number): ReadBack {
  const elements = new Map<number, ReadElement>();
  let current = -1, moves = 0, radiusMismatch = 0;
  const Reader = ToolpathReader();
  const tp = new Reader({
    addLine: (modal, v1, v2) => {
      if (modal.motion === 'G0' || (v1.x === v2.x && v1.y === v2.y)) return;
      target(elements, current).polylines.push(linePoints(v1.x, v1.y, v2.x, v2.y, spacing));
      moves++;
    },
    addArcCurve: (modal, v1, v2, v0) => {
      const ccw = modal.motion === 'G3';
      const r0 = Math.hypot(v1.x - v0.x, v1.y - v0.y), r1 = Math.hypot(v2.x - v0.x, v2.y - v0.y);
      radiusMismatch = Math.max(radiusMismatch, Math.abs(r1 - r0));
      const sweep = sweepOf(Math.atan2(v1.y - v0.y, v1.x - v0.x), Math.atan2(v2.y - v0.y, v2.x - v0.x), ccw);
      target(elements, current).polylines.push(arcPoints(v1.x, v1.y, v2.x, v2.y, v0.x, v0.y, sweep, chord, spacing));
      moves++;
    },
  });
  // The callback runs after each line's moves: an element comment applies to the moves after its line.
  tp.loadFromStringSync(text, (data) => {
    for (const c of data.comments ?? []) {
      const m = ELEMENT_COMMENT.exec(c);
      if (m) current = machineKey(Number(m[1]), m[2] === undefined ? undefined : Number(m[2]));
    }
  });
  return { elements, errorBound: chord, radiusMismatch, moves, units: null };
}

interface DxfEntity {
  type: string;
  vertices?: { x: number; y: number }[];
  center?: { x: number; y: number };
  radius?: number;
  startAngle?: number;
  endAngle?: number;
}

/**
 * Read DXF back.
 * @param spans which entities (in file order) draw which element (../write/dxf.ts)
 */
export function readBackDxf(text: string, spans: readonly DxfSpan[], chord: number, spacing: number): ReadBack {
  const Parser = DxfReader();
  const dxf = new Parser().parseSync(text) as unknown as { entities: DxfEntity[]; header?: Record<string, unknown> } | null;
  if (!dxf) throw new Error('the DXF reader returned nothing');
  const owner = new Float64Array(dxf.entities.length).fill(-1);
  for (const s of spans) for (let k = s.first; k < s.first + s.count && k < owner.length; k++) owner[k] = s.key;
  const elements = new Map<number, ReadElement>();
  let moves = 0;
  dxf.entities.forEach((e, k) => {
    const into = target(elements, owner[k]);
    if (e.type === 'LINE' && e.vertices && e.vertices.length >= 2) {
      into.polylines.push(linePoints(e.vertices[0].x, e.vertices[0].y, e.vertices[1].x, e.vertices[1].y, spacing));
      moves++;
    } else if (e.type === 'ARC' && e.center && e.radius !== undefined && e.startAngle !== undefined && e.endAngle !== undefined) {
      const { x: cx, y: cy } = e.center, r = e.radius;
      const x0 = cx + r * Math.cos(e.startAngle), y0 = cy + r * Math.sin(e.startAngle);
      const x1 = cx + r * Math.cos(e.endAngle), y1 = cy + r * Math.sin(e.endAngle);
      into.polylines.push(arcPoints(x0, y0, x1, y1, cx, cy, sweepOf(e.startAngle, e.endAngle, true), chord, spacing));
      moves++;
    } else {
      throw new Error(`the DXF reader found an entity of type ${e.type} where only LINE and ARC were written`);
    }
  });
  const u = dxf.header?.$INSUNITS;
  return { elements, errorBound: chord, radiusMismatch: 0, moves, units: typeof u === 'number' ? u : null };
}
