/**
 * DXF (ASCII) as a machine sink: LINE and ARC entities, one layer per stroke
 * colour, millimetres.
 *
 * Why LINE and ARC rather than polylines with bulges: they are the entities
 * every DXF reader knows (R12 and later), each one stands alone (a reader that
 * drops one entity loses one piece, not a contour), and an ARC states centre,
 * radius and angles directly, where a bulge asks the reader to rebuild the
 * centre from the chord, which is ill-conditioned near a half turn.
 *
 * File (Autodesk DXF reference; ../../shared/REFERENCES.md §12.2): a HEADER
 * with $ACADVER AC1009 (R12), $INSUNITS 4 (millimetres; a later variable that
 * R12-only readers skip) and $MEASUREMENT 1 (metric); a TABLES section with the
 * LAYER table; ENTITIES; EOF. ARC angles are degrees, counter-clockwise about
 * +Z from 50 to 51, so a clockwise arc P1→P2 is written from angle(P2) to
 * angle(P1). No handles or subclass markers (R13+ only).
 */
import type { MachineGroupStart, MachineSink } from '../machine/sink.js';
import { arcOnRoundedChord } from '../machine/roundedArc.js';
import { angleDigits, formatNumber } from './numbers.js';
import { gcodeNumber } from './gcode.js';
import { machineKey } from '../machine/drawing.js';

/** Which entities (index range in the ENTITIES section, in order) draw one element (`key`: ../machine/drawing.ts machineKey). */
export interface DxfSpan {
  key: number;
  first: number;
  count: number;
}

/** DXF AutoCAD Color Index of the seven basic colours (red 1 … white/black 7). */
const ACI: readonly [number, number, number, number][] = [
  [1, 255, 0, 0], [2, 255, 255, 0], [3, 0, 255, 0], [4, 0, 255, 255], [5, 0, 0, 255], [6, 255, 0, 255], [7, 0, 0, 0], [7, 255, 255, 255],
];

/** Nearest basic ACI colour of `#rrggbb` (7 for anything else). */
export function aciOf(group: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(group);
  if (!m) return 7;
  const r = parseInt(m[1], 16), g = parseInt(m[2], 16), b = parseInt(m[3], 16);
  let best = 7, bd = Infinity;
  for (const [k, cr, cg, cb] of ACI) {
    const d = (r - cr) ** 2 + (g - cg) ** 2 + (b - cb) ** 2;
    if (d < bd) {
      bd = d;
      best = k;
    }
  }
  return best;
}

/** Layer name of a stroke colour: `STROKE_RRGGBB`, or `STROKE_NONE` (letters, digits and _ only). */
export function layerName(group: string): string {
  return 'STROKE_' + group.replace(/^#/, '').replace(/[^0-9a-zA-Z]/g, '_').toUpperCase();
}

const DEG = 180 / Math.PI;

/** Writes a DXF file; {@link DxfWriter.toString} gives the text. */
export class DxfWriter implements MachineSink {
  readonly spans: DxfSpan[] = [];
  readonly stats = { lines: 0, arcs: 0, skipped: 0, flat: 0 };
  private readonly ent: string[] = [];
  private count = 0;
  private readonly layers = new Map<string, number>();
  private layer = layerName('none');
  private readonly d: number;
  private readonly q: number;
  private x = NaN;
  private y = NaN;

  /** @param digits decimals of coordinates and radii (mm) */
  constructor(digits: number) {
    this.d = digits;
    this.q = Math.pow(10, -digits);
  }

  private n(v: number, d = this.d): string {
    return gcodeNumber(v, d);
  }

  private r(v: number): number {
    return Number(formatNumber(v, this.d));
  }

  beginElement(el: MachineGroupStart): void {
    this.layer = layerName(el.group);
    if (!this.layers.has(this.layer)) this.layers.set(this.layer, aciOf(el.group));
    this.spans.push({ key: machineKey(el.index, el.copy), first: this.count, count: 0 });
  }

  moveTo(x: number, y: number): void {
    this.x = this.r(x);
    this.y = this.r(y);
  }

  private push(text: string): void {
    this.ent.push(text);
    this.count++;
    const s = this.spans[this.spans.length - 1];
    if (s) s.count++;
  }

  lineTo(x: number, y: number): void {
    const ex = this.r(x), ey = this.r(y);
    if (ex === this.x && ey === this.y) {
      this.stats.skipped++;
      return;
    }
    this.push(`0\nLINE\n8\n${this.layer}\n10\n${this.n(this.x)}\n20\n${this.n(this.y)}\n30\n0\n11\n${this.n(ex)}\n21\n${this.n(ey)}\n31\n0\n`);
    this.x = ex;
    this.y = ey;
    this.stats.lines++;
  }

  arcTo(x: number, y: number, cx: number, cy: number, ccw: boolean): void {
    const sx = this.x, sy = this.y, ex = this.r(x), ey = this.r(y);
    if (ex === sx && ey === sy) {
      this.stats.skipped++;
      return;
    }
    const a = arcOnRoundedChord(sx, sy, ex, ey, cx, cy, ccw, this.q);
    if (a === null) {
      this.stats.flat++;
      this.lineTo(ex, ey);
      return;
    }
    const { ox, oy, r } = a;
    const a0 = Math.atan2(sy - oy, sx - ox) * DEG, a1 = Math.atan2(ey - oy, ex - ox) * DEG;
    const [from, to] = ccw ? [a0, a1] : [a1, a0];
    const ad = angleDigits(this.d, r);
    // In [0, 360): an angle just under 360 that rounds up to it is written as 0 (the same direction).
    const ang = (a: number): string => {
      const t = this.n(((a % 360) + 360) % 360, ad);
      return Number(t) >= 360 ? this.n(0, ad) : t;
    };
    this.push(`0\nARC\n8\n${this.layer}\n10\n${this.n(ox)}\n20\n${this.n(oy)}\n30\n0\n40\n${this.n(r)}\n50\n${ang(from)}\n51\n${ang(to)}\n`);
    this.x = ex;
    this.y = ey;
    this.stats.arcs++;
  }

  finish(): void {}

  /** The whole file. */
  toString(): string {
    const layers = [...this.layers].map(([name, aci]) => `0\nLAYER\n2\n${name}\n70\n0\n62\n${aci}\n6\nCONTINUOUS\n`).join('');
    return (
      '0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\nAC1009\n9\n$INSUNITS\n70\n4\n9\n$MEASUREMENT\n70\n1\n0\nENDSEC\n' +
      `0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLAYER\n70\n${this.layers.size}\n${layers}0\nENDTAB\n0\nENDSEC\n` +
      `0\nSECTION\n2\nENTITIES\n${this.ent.join('')}0\nENDSEC\n0\nEOF\n`
    );
  }
}
