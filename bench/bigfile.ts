/**
 * The pipeline benchmark's input: 400 closed smooth contours of 2,500 vertices
 * each (about 18 MB), written as dense polylines in a path's `d`, as a traced or
 * exported drawing would be. Our own generated scenario; seeded.
 */
/** The benchmarks' seeded generator (a linear congruential one, common practice). */
export function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32);
}

/**
 * One smooth closed contour, the k-th of a grid `cols` wide (60 units apart):
 * a radius of 20 with two seeded ripples, as `x y` pairs joined by ` L`.
 */
export function contourPoints(rand: () => number, k: number, cols: number, vertices: number, digits: number): string {
  const cx = 30 + 60 * (k % cols), cy = 30 + 60 * Math.floor(k / cols);
  const a1 = rand() * 4, a2 = rand() * 2, p1 = rand() * 6, p2 = rand() * 6;
  const pts: string[] = [];
  for (let i = 0; i < vertices; i++) {
    const t = (2 * Math.PI * i) / vertices;
    const r = 20 + a1 * Math.sin(3 * t + p1) + a2 * Math.cos(7 * t + p2);
    pts.push(`${(cx + r * Math.cos(t)).toFixed(digits)} ${(cy + r * Math.sin(t)).toFixed(digits)}`);
  }
  return pts.join(' L');
}

/** The contours alone: seeded smooth closed contours as `M … L … Z` path text. */
export function contourPaths(contours = 400, vertices = 2500): string[] {
  const rand = rng(12345);
  const cols = Math.ceil(Math.sqrt(contours));
  return Array.from({ length: contours }, (_, k) => `M${contourPoints(rand, k, cols, vertices, 4)} Z`);
}

export function bigDrawing(contours = 400, vertices = 2500): string {
  const parts = contourPaths(contours, vertices).map((d, k) => `  <path id="c${k}" d="${d}"/>`);
  const size = 60 * Math.ceil(Math.sqrt(contours));
  return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="${size}mm" height="${size}mm" viewBox="0 0 ${size} ${size}">\n<g fill="none" stroke="black" stroke-width="0.1">\n${parts.join('\n')}\n</g>\n</svg>\n`;
}
