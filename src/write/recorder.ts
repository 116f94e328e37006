/**
 * A sink that keeps every command as a plain object, exactly as given (no
 * rounding), for tests and for the report.
 */
import type { PathSink } from './sink.js';
import { OP_A, OP_L, OP_M, OP_Z, type PathData } from '../svg/pathTypes.js';

/** One recorded sink call; coordinates absolute, rotation in degrees. */
export type PathCommand =
  | { op: 'M'; x: number; y: number }
  | { op: 'L'; x: number; y: number }
  | { op: 'A'; rx: number; ry: number; rotation: number; largeArc: boolean; sweep: boolean; x: number; y: number }
  | { op: 'Z' };

/** Records commands in call order; see {@link RecordingSink.toPathData} for the flat form. */
export class RecordingSink implements PathSink {
  /** The calls so far, oldest first. */
  readonly commands: PathCommand[] = [];

  moveTo(x: number, y: number): void {
    this.commands.push({ op: 'M', x, y });
  }

  lineTo(x: number, y: number): void {
    this.commands.push({ op: 'L', x, y });
  }

  arcTo(rx: number, ry: number, rotation: number, largeArc: boolean, sweep: boolean, x: number, y: number): void {
    this.commands.push({ op: 'A', rx, ry, rotation, largeArc, sweep, x, y });
  }

  closePath(): void {
    this.commands.push({ op: 'Z' });
  }

  /** Number of recorded commands of one kind. */
  count(op: PathCommand['op']): number {
    let n = 0;
    for (const c of this.commands) if (c.op === op) n++;
    return n;
  }

  /** The recorded commands as flat path data (../svg/pathTypes.ts layout; flags as 0/1). */
  toPathData(): PathData {
    const ops = new Uint8Array(this.commands.length);
    const args: number[] = [];
    this.commands.forEach((c, k) => {
      switch (c.op) {
        case 'M':
          ops[k] = OP_M;
          args.push(c.x, c.y);
          break;
        case 'L':
          ops[k] = OP_L;
          args.push(c.x, c.y);
          break;
        case 'A':
          ops[k] = OP_A;
          args.push(c.rx, c.ry, c.rotation, c.largeArc ? 1 : 0, c.sweep ? 1 : 0, c.x, c.y);
          break;
        case 'Z':
          ops[k] = OP_Z;
          break;
      }
    });
    return { ops, args: Float64Array.from(args) };
  }
}
