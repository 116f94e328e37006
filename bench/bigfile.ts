/**
 * The pipeline benchmark's input: 400 closed smooth contours of 2,500 vertices
 * each (about 18 MB), written as dense polylines in a path's `d`, as a traced or
 * exported drawing would be. Our own generated scenario; seeded.
 */
/** The contours alone: seeded smooth closed contours as `M … L … Z` path text. */
export function contourPaths(contours = 400, vertices = 2500): string[] {
  let seed = 12345;
  const rand = (): number => {
    seed = (seed * 1664525 + 1013904223) >>> 0;
    return seed / 2 ** 32;
  };
  const out: string[] = [];
  const cols = Math.ceil(Math.sqrt(contours));
  for (let k = 0; k < contours; k++) {
    const cx = 30 + 60 * (k % cols), cy = 30 + 60 * Math.floor(k / cols);
    const a1 = rand() * 4, a2 = rand() * 2, p1 = rand() * 6, p2 = rand() * 6;
    const pts: string[] = [];
    for (let i = 0; i < vertices; i++) {
      const t = (2 * Math.PI * i) / vertices;
      const r = 20 + a1 * Math.sin(3 * t + p1) + a2 * Math.cos(7 * t + p2);
      pts.push(`${(cx + r * Math.cos(t)).toFixed(4)} ${(cy + r * Math.sin(t)).toFixed(4)}`);
    }
    out.push(`M${pts.join(' L')} Z`);
  }
  return out;
}

export function bigDrawing(contours = 400, vertices = 2500): string {
  const parts = contourPaths(contours, vertices).map((d, k) => `  <path id="c${k}" d="${d}"/>`);
  const size = 60 * Math.ceil(Math.sqrt(contours));
  return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="${size}mm" height="${size}mm" viewBox="0 0 ${size} ${size}">\n<g fill="none" stroke="black" stroke-width="0.1">\n${parts.join('\n')}\n</g>\n</svg>\n`;
}
