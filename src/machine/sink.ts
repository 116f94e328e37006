/**
 * Where machine moves go. Every coordinate is absolute, in machine mm (X right,
 * Y up). A `moveTo` is travel with the tool off; `lineTo` and `arcTo` work with
 * the tool on, so a sink switches the tool itself (off before travel, on before
 * the first work move after it). Writers (../write/gcode.ts, ../write/dxf.ts),
 * the recorder below and the time model all take the same calls.
 */

/** What the next moves belong to. */
export interface MachineGroupStart {
  /** Element index in the document. */
  index: number;
  /** The copy drawn by `<use>` these moves draw (1, 2, … in the element's list of copies), or absent for the element where it stands. */
  copy?: number;
  /** Element name for comments, e.g. `path#edge`. */
  label: string;
  /** Stroke colour key (`#rrggbb` or `none`): layer, power and feed. */
  group: string;
}

export interface MachineSink {
  /** The following moves draw this element. */
  beginElement(el: MachineGroupStart): void;
  /** Travel to (x, y), tool off. */
  moveTo(x: number, y: number): void;
  /** Straight work move to (x, y). */
  lineTo(x: number, y: number): void;
  /**
   * Circular work move to (x, y) about the centre (cx, cy), counter-clockwise
   * seen from +Z when `ccw`, else clockwise. Less than a full turn; the start is
   * the current point.
   */
  arcTo(x: number, y: number, cx: number, cy: number, ccw: boolean): void;
  /** No more moves: tool off, end block. */
  finish(): void;
}

/** One recorded move (machine mm). `arc` moves carry centre and sense. */
export type MachineMove =
  | { kind: 'travel' | 'line'; x0: number; y0: number; x: number; y: number; group: string }
  | { kind: 'arc'; x0: number; y0: number; x: number; y: number; cx: number; cy: number; ccw: boolean; group: string };

/** Keeps every move exactly as given (no rounding), for tests and the time model. */
export class RecordingMachineSink implements MachineSink {
  readonly moves: MachineMove[] = [];
  readonly elements: MachineGroupStart[] = [];
  private x = 0;
  private y = 0;
  private group = 'none';
  finished = false;

  beginElement(el: MachineGroupStart): void {
    this.elements.push(el);
    this.group = el.group;
  }

  moveTo(x: number, y: number): void {
    this.moves.push({ kind: 'travel', x0: this.x, y0: this.y, x, y, group: this.group });
    this.x = x;
    this.y = y;
  }

  lineTo(x: number, y: number): void {
    this.moves.push({ kind: 'line', x0: this.x, y0: this.y, x, y, group: this.group });
    this.x = x;
    this.y = y;
  }

  arcTo(x: number, y: number, cx: number, cy: number, ccw: boolean): void {
    this.moves.push({ kind: 'arc', x0: this.x, y0: this.y, x, y, cx, cy, ccw, group: this.group });
    this.x = x;
    this.y = y;
  }

  finish(): void {
    this.finished = true;
  }

  /** Number of recorded moves of one kind. */
  count(kind: MachineMove['kind']): number {
    let n = 0;
    for (const m of this.moves) if (m.kind === kind) n++;
    return n;
  }
}
