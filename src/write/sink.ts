/**
 * Where drawing goes: the fitter's segments are replayed into a sink, so one
 * emitter can write SVG path text, record commands for a test, or feed the report.
 * All coordinates are absolute, in the coordinate system the sink was made for.
 */
export interface PathSink {
  moveTo(x: number, y: number): void;
  lineTo(x: number, y: number): void;
  /** SVG elliptical arc from the current point (W3C SVG 1.1 §8.3.8). rotation in degrees. */
  arcTo(rx: number, ry: number, rotation: number, largeArc: boolean, sweep: boolean, x: number, y: number): void;
  closePath(): void;
}
