/**
 * A generic geometric product for R(2,0,1), blade by blade, as an oracle for the
 * specialised kernel: every basis-blade product is computed from the metric
 * (e0² = 0, e1² = e2² = 1) and the sign of reordering. Written for the tests.
 *
 * Multivectors are arrays of 8 coefficients indexed by bit mask: bit 0 = e0,
 * bit 1 = e1, bit 2 = e2 (so index 3 = e01, 5 = e02, 6 = e12, 7 = e012).
 */
const METRIC = [0, 1, 1];

function reorderSign(a: number, b: number): number {
  let swaps = 0;
  for (let x = a >> 1; x; x >>= 1) {
    let m = x & b;
    while (m) {
      swaps += m & 1;
      m >>= 1;
    }
  }
  return swaps & 1 ? -1 : 1;
}

export type MV = number[];

export function gp(a: MV, b: MV): MV {
  const out = new Array(8).fill(0);
  for (let i = 0; i < 8; i++) {
    if (!a[i]) continue;
    for (let j = 0; j < 8; j++) {
      if (!b[j]) continue;
      let s = reorderSign(i, j);
      const common = i & j;
      for (let k = 0; k < 3; k++) if (common & (1 << k)) s *= METRIC[k];
      if (s) out[i ^ j] += s * a[i] * b[j];
    }
  }
  return out;
}

export function grade(a: MV, g: number): MV {
  return a.map((v, i) => (popcount(i) === g ? v : 0));
}

function popcount(x: number): number {
  let c = 0;
  for (; x; x >>= 1) c += x & 1;
  return c;
}

export function reverse(a: MV): MV {
  return a.map((v, i) => {
    const g = popcount(i);
    return (g * (g - 1)) / 2 % 2 ? -v : v;
  });
}

/** Complement dual: e_A ∧ dual(e_A) = e012. */
function dual(a: MV): MV {
  const out = new Array(8).fill(0);
  for (let i = 0; i < 8; i++) {
    if (!a[i]) continue;
    const c = 7 ^ i;
    // sign s with e_i ∧ (s e_c) = e012: the outer product sign is the reorder sign of (i, c).
    out[c] += reorderSign(i, c) * a[i];
  }
  return out;
}

function undual(a: MV): MV {
  const out = new Array(8).fill(0);
  for (let c = 0; c < 8; c++) {
    if (!a[c]) continue;
    const i = 7 ^ c;
    out[i] += reorderSign(i, c) * a[c];
  }
  return out;
}

function outer(a: MV, b: MV): MV {
  const out = new Array(8).fill(0);
  for (let i = 0; i < 8; i++) {
    if (!a[i]) continue;
    for (let j = 0; j < 8; j++) {
      if (!b[j] || i & j) continue;
      out[i ^ j] += reorderSign(i, j) * a[i] * b[j];
    }
  }
  return out;
}

export function join(a: MV, b: MV): MV {
  return undual(outer(dual(a), dual(b)));
}

/** Kernel layouts ↔ multivectors. */
export const fromLine = (l: Float64Array): MV => [0, l[0], l[1], 0, l[2], 0, 0, 0];
export const fromPoint = (p: Float64Array): MV => [0, 0, 0, p[0], 0, p[1], p[2], 0];
export const fromMotor = (m: Float64Array): MV => [m[0], 0, 0, m[1], 0, m[2], m[3], 0];
export const lineOf = (a: MV): number[] => [a[1], a[2], a[4]];
export const pointOf = (a: MV): number[] => [a[3], a[5], a[6]];
export const motorOf = (a: MV): number[] => [a[0], a[3], a[5], a[6]];
