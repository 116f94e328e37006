/** Area of a polyline in mm: what the path plan's nesting and the fill test of the drawing model both need. */

/**
 * Signed area of a polyline closed back to its first vertex (shoelace formula), mm²; positive when
 * counter-clockwise in y-up axes.
 * @param xy x0, y0, x1, y1, … (stride 2)
 */
export function signedArea(xy: Float64Array): number {
  const n = xy.length >> 1;
  let a = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) a += xy[2 * j] * xy[2 * i + 1] - xy[2 * i] * xy[2 * j + 1];
  return a / 2;
}
