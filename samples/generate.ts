/**
 * Writes the bundled samples other than bracket.svg: our own made-up jobs, of
 * the kinds the tool is for. Seeded, so the files are the same on every run:
 * `npx tsx samples/generate.ts`.
 *
 * - coaster.svg: a traced bitmap, a scalloped coaster with a hanging hole and a
 *   leaf, as dense polylines with the tracer's pixel wobble;
 * - gear.svg: a CAD or mesh export, a 12-tooth gear with a keyed bore, as
 *   polylines with sharp corners at the tooth roots and tips;
 * - icons/: plotter art drawn with Bézier curves (circles from four cubics, a
 *   heart, a rounded tag, a wave from quadratics).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const HERE = dirname(fileURLToPath(import.meta.url));
const f = (v: number): string => (Math.abs(v) < 5e-4 ? '0' : v.toFixed(3));

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32);
}

function svg(widthMm: number, heightMm: number, body: string[], title: string): string {
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${widthMm}mm" height="${heightMm}mm" viewBox="0 0 ${widthMm} ${heightMm}">`,
    `  <title>${title}</title>`,
    ...body.map((l) => `  ${l}`),
    '</svg>',
    '',
  ].join('\n');
}

/** A closed polyline through (x(t), y(t)) for t in [0, 1), n vertices, snapped to a 1/px grid like a tracer's output. */
function traced(n: number, at: (t: number) => [number, number], px: number, rand: () => number): string {
  const pts: string[] = [];
  for (let i = 0; i < n; i++) {
    const [x, y] = at(i / n);
    // The tracer follows pixel edges: positions land on the pixel grid, give or take a quarter pixel.
    const jx = Math.round(x * px) / px + ((rand() - 0.5) * 0.5) / px;
    const jy = Math.round(y * px) / px + ((rand() - 0.5) * 0.5) / px;
    pts.push(`${f(jx)},${f(jy)}`);
  }
  return `M${pts.join(' ')}Z`;
}

function coaster(): string {
  const rand = rng(42);
  const px = 12; // 12 pixels per mm (about 300 dpi)
  const c = 50;
  const outer = traced(2400, (t) => {
    const a = 2 * Math.PI * t;
    const r = 44 + 1.6 * Math.cos(16 * a); // 16 scallops
    return [c + r * Math.cos(a), c + r * Math.sin(a)];
  }, px, rand);
  const hole = traced(300, (t) => {
    const a = -2 * Math.PI * t;
    return [c + 3 * Math.cos(a), 14 + 3 * Math.sin(a)];
  }, px, rand);
  const leaf = traced(900, (t) => {
    // A leaf: two circular flanks meeting at sharp tips (lens shape), tilted by 30°.
    const a = 2 * Math.PI * t, s = Math.sin(a);
    const lx = 22 * Math.cos(a), ly = 9 * s * Math.abs(s) ** 0.2;
    const ca = Math.cos(Math.PI / 6), sa = Math.sin(Math.PI / 6);
    return [c + 4 + lx * ca - ly * sa, c + 6 + lx * sa + ly * ca];
  }, px, rand);
  return svg(100, 100, [
    '<g fill="none" stroke="#000" stroke-width="0.1">',
    `  <path id="edge" d="${outer}"/>`,
    `  <path id="hanging-hole" d="${hole}"/>`,
    `  <path id="leaf" stroke="#c00" d="${leaf}"/>`,
    '</g>',
  ], 'Scalloped coaster, traced from a 300 dpi scan (cut the black, engrave the red)');
}

function gear(): string {
  const teeth = 12, rRoot = 38, rTip = 46, c = 50;
  const pts: string[] = [];
  for (let k = 0; k < teeth; k++) {
    // Each tooth: root arc, straight-ish flank, rounded tip, flank; sampled densely as a mesh export would.
    const a0 = (2 * Math.PI * k) / teeth, pitch = (2 * Math.PI) / teeth;
    const seg = (from: number, to: number, r0: number, r1: number, n: number): void => {
      for (let i = 0; i < n; i++) {
        const u = i / n, a = a0 + pitch * (from + (to - from) * u), r = r0 + (r1 - r0) * u;
        pts.push(`${f(c + r * Math.cos(a))},${f(c + r * Math.sin(a))}`);
      }
    };
    seg(0, 0.3, rRoot, rRoot, 24); // root
    seg(0.3, 0.4, rRoot, rTip, 16); // flank
    seg(0.4, 0.75, rTip, rTip, 28); // tip
    seg(0.75, 0.85, rTip, rRoot, 16); // flank
    seg(0.85, 1, rRoot, rRoot, 12); // root
  }
  // The bore (a circle of 10 mm radius, 180 vertices) with a 4 mm keyway at the top.
  const bore: string[] = [];
  const rb = 10, half = Math.asin(2 / rb);
  for (let i = 0; i <= 180; i++) {
    const a = -Math.PI / 2 + half + ((2 * Math.PI - 2 * half) * i) / 180;
    bore.push(`${f(c + rb * Math.cos(a))},${f(c + rb * Math.sin(a))}`);
  }
  const top = c - rb - 2;
  bore.push(`${f(c - 2)},${f(top)}`, `${f(c + 2)},${f(top)}`);
  return svg(100, 100, [
    '<g fill="none" stroke="#000" stroke-width="0.05">',
    `  <polygon id="gear" points="${pts.join(' ')}"/>`,
    `  <polygon id="bore" points="${bore.join(' ')}"/>`,
    '</g>',
  ], '12-tooth gear with keyed bore, exported from a mesh');
}

/** A circle as four cubic Béziers (control distance 0.5523 r, common practice, value from memory). */
function bezierCircle(cx: number, cy: number, r: number): string {
  const k = 0.5523 * r;
  return `M${f(cx + r)} ${f(cy)}C${f(cx + r)} ${f(cy + k)} ${f(cx + k)} ${f(cy + r)} ${f(cx)} ${f(cy + r)}` +
    `C${f(cx - k)} ${f(cy + r)} ${f(cx - r)} ${f(cy + k)} ${f(cx - r)} ${f(cy)}` +
    `C${f(cx - r)} ${f(cy - k)} ${f(cx - k)} ${f(cy - r)} ${f(cx)} ${f(cy - r)}` +
    `C${f(cx + k)} ${f(cy - r)} ${f(cx + r)} ${f(cy - k)} ${f(cx + r)} ${f(cy)}Z`;
}

function icons(): Record<string, string> {
  const frame = (title: string, body: string[]): string =>
    svg(30, 30, ['<g fill="none" stroke="#000" stroke-width="0.3">', ...body.map((l) => `  ${l}`), '</g>'], title);
  return {
    'target.svg': frame('Target: three rings', [1, 2, 3].map((i) => `<path d="${bezierCircle(15, 15, 4 * i)}"/>`)),
    'heart.svg': frame('Heart', ['<path d="M15 26C9 21 3 16.5 3 10.5C3 6.5 6 4 9.5 4C12 4 14 5.5 15 7.5C16 5.5 18 4 20.5 4C24 4 27 6.5 27 10.5C27 16.5 21 21 15 26Z"/>']),
    'tag.svg': frame('Luggage tag with eyelet', [
      '<path d="M8 3H22Q25 3 25 6V24Q25 27 22 27H8Q5 27 5 24V6Q5 3 8 3Z"/>',
      `<path d="${bezierCircle(15, 7, 1.5)}"/>`,
    ]),
    'wave.svg': frame('Wave border', ['<path d="M2 15Q5.5 9 9 15T16 15T23 15T30 15"/>', '<path d="M2 20Q5.5 14 9 20T16 20T23 20T30 20"/>']),
  };
}

function write(rel: string, text: string): void {
  const path = join(HERE, rel);
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, text);
}

write('coaster.svg', coaster());
write('gear.svg', gear());
for (const [name, text] of Object.entries(icons())) write(join('icons', name), text);
