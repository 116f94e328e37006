/**
 * Algebraic circle fit of a polyline's vertices (Kåsa: least squares of
 * x² + y² + Bx + Cy + D, I. Kåsa, IEEE Trans. Instrum. Meas. 25 (1976) 8–14;
 * REFERENCES.md §10.1 KA76 via CL05), on coordinates centred on their mean
 * (§10.1: centring keeps it exact far from the origin). Used only on a whole
 * closed contour, where Kåsa is unbiased enough (CH10 §5.3); vertices on one
 * circle give that circle exactly (§10.3 C1).
 */

/** Centre (cx, cy) and radius r of the fitted circle, or null when the points are (nearly) on a line. */
export function kasaCircle(xy: Float64Array, n: number): { cx: number; cy: number; r: number } | null {
  if (n < 3) return null;
  let mx = 0, my = 0;
  for (let i = 0; i < n; i++) {
    mx += xy[2 * i];
    my += xy[2 * i + 1];
  }
  mx /= n;
  my /= n;
  let sxx = 0, sxy = 0, syy = 0, sxz = 0, syz = 0, sz = 0;
  for (let i = 0; i < n; i++) {
    const x = xy[2 * i] - mx, y = xy[2 * i + 1] - my, z = x * x + y * y;
    sxx += x * x;
    sxy += x * y;
    syy += y * y;
    sxz += x * z;
    syz += y * z;
    sz += z;
  }
  // Centred: the normal equations split into D = −mean(z) and a 2×2 system for B, C.
  const det = sxx * syy - sxy * sxy;
  if (!(Math.abs(det) > 1e-12 * (sxx + syy) ** 2)) return null;
  const B = (-sxz * syy + syz * sxy) / det, C = (-syz * sxx + sxz * sxy) / det, D = -sz / n;
  const r2 = 0.25 * (B * B + C * C) - D;
  if (!(r2 > 0)) return null;
  return { cx: mx - 0.5 * B, cy: my - 0.5 * C, r: Math.sqrt(r2) };
}
