/**
 * Point marks in a machine file: a subpath that draws only a point (a pierce
 * mark such as `M x y Z`) is not written (a warning says so), so the proof
 * measures against the rest of the element.
 */
import { OP_A, OP_ARGS, OP_M, type PathData } from '../svg/pathTypes.js';

/**
 * The path data without its subpaths that draw only a point (a pierce mark such as `M x y Z`): they are
 * not written to a machine file (a warning says so), so the proof measures against the rest.
 */
export function withoutPointSubpaths(p: PathData): PathData {
  const ops: number[] = [], args: number[] = [];
  let i = 0, j = 0;
  while (i < p.ops.length) {
    // One subpath: from a moveto (or the start) up to the next moveto.
    const i0 = i, j0 = j;
    let still = true;
    const sx = p.ops[i] === OP_M ? p.args[j] : NaN, sy = p.ops[i] === OP_M ? p.args[j + 1] : NaN;
    do {
      const op = p.ops[i], n = OP_ARGS[op];
      if (op !== OP_M) {
        const first = op === OP_A ? 5 : 0;
        for (let k = first; k + 1 < n; k += 2) if (p.args[j + k] !== sx || p.args[j + k + 1] !== sy) still = false;
      }
      i++;
      j += n;
    } while (i < p.ops.length && p.ops[i] !== OP_M);
    const draws = i - i0 > 1;
    if (draws && still) continue;
    for (let k = i0; k < i; k++) ops.push(p.ops[k]);
    for (let k = j0; k < j; k++) args.push(p.args[k]);
  }
  return { ops: Uint8Array.from(ops), args: Float64Array.from(args) };
}
