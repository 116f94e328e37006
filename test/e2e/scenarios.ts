/**
 * Invented scenario drawings for the round-trip test, 60 × 40 mm with one
 * user unit = 1 mm at the root. Each builder returns a whole SVG document.
 * Coordinates come from closed forms or a seeded generator, never from a
 * real file.
 */

import { rng as seeded } from '../rng.js';
export { seeded };

/** Page size of every scenario, mm. */
export const PAGE_W = 60;
export const PAGE_H = 40;

function page(body: string): string {
  return `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="${PAGE_W}mm" height="${PAGE_H}mm" viewBox="0 0 ${PAGE_W} ${PAGE_H}">
${body}
</svg>
`;
}

const f = (v: number, digits: number): string => String(+v.toFixed(digits));

/** A logo as a tracer writes it: a dense polygon on a 0.02 mm grid with a little jitter, and an open traced stroke. */
export function tracedLogo(): string {
  const rnd = seeded(20240611);
  const q = (v: number): string => f(Math.round((v + (rnd() - 0.5) * 0.008) / 0.02) * 0.02, 2);
  const pts: string[] = [];
  for (let i = 0; i < 240; i++) {
    const t = (2 * Math.PI * i) / 240;
    const r = 13 + 2.5 * Math.cos(3 * t);
    pts.push(`${q(30 + r * Math.cos(t))},${q(20 + r * Math.sin(t))}`);
  }
  const stroke: string[] = [];
  for (let i = 0; i <= 90; i++) {
    const t = Math.PI * (0.1 + (1.3 * i) / 90);
    stroke.push(`${q(30 + 6 * Math.cos(t))} ${q(20 - 6 * Math.sin(t))}`);
  }
  return page(`  <polygon id="logo" fill="#223" points="${pts.join(' ')}"/>
  <polyline id="swash" fill="none" stroke="#e80" stroke-width="0.5" points="${stroke.join(' ')}"/>`);
}

/** Points of a fillet arc as a CAD exporter writes it: `n` chords, endpoints included except the first. */
function filletChords(cx: number, cy: number, r: number, a0: number, a1: number, n: number, out: string[]): void {
  for (let i = 1; i <= n; i++) {
    const a = a0 + ((a1 - a0) * i) / n;
    out.push(`L${f(cx + r * Math.cos(a), 4)} ${f(cy + r * Math.sin(a), 4)}`);
  }
}

/** A CAD export: a plate with rounded corners, a hole and a slot, every arc broken into short lines. */
export function cadPlate(): string {
  const d: string[] = ['M9 5', 'L51 5'];
  const h = Math.PI / 2;
  filletChords(51, 9, 4, -h, 0, 12, d);
  d.push('L55 31');
  filletChords(51, 31, 4, 0, h, 12, d);
  d.push('L9 35');
  filletChords(9, 31, 4, h, 2 * h, 12, d);
  d.push('L5 9');
  filletChords(9, 9, 4, 2 * h, 3 * h, 12, d);
  d.push('Z');
  // The hole: 48 chords of r = 3.
  d.push('M18 20');
  filletChords(15, 20, 3, 0, 2 * Math.PI, 48, d);
  d.push('Z');
  // The slot: two half circles of r = 2.5 joined by lines.
  d.push('M33 17.5', 'L47 17.5');
  filletChords(47, 20, 2.5, -h, h, 24, d);
  d.push('L33 22.5');
  filletChords(33, 20, 2.5, h, 3 * h, 24, d);
  d.push('Z');
  return page(`  <path id="plate" fill="#345" fill-rule="evenodd" d="${d.join(' ')}"/>`);
}

/** Glyph-like outlines made of cubic and quadratic Béziers, with a counter and a dot of arcs. */
export function bezierGlyphs(): string {
  const k = 0.5523; // cubic circle constant, 4/3·(√2 − 1) (common practice)
  const ell = (cx: number, cy: number, rx: number, ry: number, reverse: boolean): string => {
    const a = rx * k, b = ry * k;
    return reverse
      ? `M${cx + rx} ${cy} C${cx + rx} ${cy - b} ${cx + a} ${cy - ry} ${cx} ${cy - ry} C${cx - a} ${cy - ry} ${cx - rx} ${cy - b} ${cx - rx} ${cy} C${cx - rx} ${cy + b} ${cx - a} ${cy + ry} ${cx} ${cy + ry} C${cx + a} ${cy + ry} ${cx + rx} ${cy + b} ${cx + rx} ${cy}Z`
      : `M${cx + rx} ${cy} C${cx + rx} ${cy + b} ${cx + a} ${cy + ry} ${cx} ${cy + ry} C${cx - a} ${cy + ry} ${cx - rx} ${cy + b} ${cx - rx} ${cy} C${cx - rx} ${cy - b} ${cx - a} ${cy - ry} ${cx} ${cy - ry} C${cx + a} ${cy - ry} ${cx + rx} ${cy - b} ${cx + rx} ${cy}Z`;
  };
  const o = `${ell(13, 20, 9, 12, false)} ${ell(13, 20, 5, 8, true)}`;
  const s = 'M43 9 C38 5 29.5 8 30.5 14 C31.5 19.5 44.5 19 44.5 26 C44.5 33 35 35 29.5 30';
  const c = 'M58 27 Q55 31 52 31 Q48 31 48 26.5 Q48 22 52 22 Q55 22 57 25 L58.5 24 Q56 20 52 20 Q46 20 46 26.5 Q46 33 52 33 Q56 33 59 28 Z';
  const dot = 'M50 11 a2 2 0 1 0 4 0 a2 2 0 1 0 -4 0 Z';
  return page(`  <path id="glyph-o" fill="#111" d="${o}"/>
  <path id="glyph-s" fill="none" stroke="#111" stroke-width="2.4" stroke-linecap="round" d="${s}"/>
  <path id="glyph-c" fill="#111" d="${c}"/>
  <path id="dot" fill="#b00" d="${dot}"/>`);
}

/** A group with a non-uniform scale and a mirror, a rotated child inside it, and a mirrored sibling. */
export function transformedGroup(): string {
  return page(`  <g id="mirror" transform="translate(58 3) scale(-1.5 0.8)">
    <path id="cam" fill="#264" d="M2 12 C6 2 16 2 20 12 A10 10 0 0 1 2 12 Z M9 14 a2.5 2.5 0 1 1 5 0 a2.5 2.5 0 1 1 -5 0 Z" fill-rule="evenodd"/>
    <g transform="rotate(30 10 30)">
      <path id="hook" fill="none" stroke="#a40" stroke-width="0.6" d="M4 30 Q10 22 16 30 T28 30"/>
    </g>
  </g>
  <path id="flipped" transform="matrix(1 0 0 -1 0 40)" fill="#46a" d="M4 4 h12 a4 4 0 0 1 4 4 v4 c0 3 -3 5 -6 5 s-6 -2 -10 -2 z"/>`);
}

/** Nested svg viewports: one meet-aligned to the right, one stretched by preserveAspectRatio="none". */
export function nestedViewports(): string {
  const petals: string[] = [];
  for (let i = 0; i < 6; i++) {
    const a = (i * Math.PI) / 3, b = a + Math.PI / 3;
    const x0 = 50 + 40 * Math.cos(a), y0 = 50 + 40 * Math.sin(a);
    const x1 = 50 + 40 * Math.cos(b), y1 = 50 + 40 * Math.sin(b);
    petals.push(`${i === 0 ? 'M' : 'L'}${f(x0, 3)} ${f(y0, 3)} A22 22 0 0 1 ${f(x1, 3)} ${f(y1, 3)}`);
  }
  return page(`  <svg x="2" y="2" width="56" height="24" viewBox="0 0 100 100" preserveAspectRatio="xMaxYMid meet">
    <path id="flower" fill="#735" d="${petals.join(' ')} Z M62 50 C62 57 57 62 50 62 C43 62 38 57 38 50 C38 43 43 38 50 38 C57 38 62 43 62 50 Z" fill-rule="evenodd"/>
  </svg>
  <svg x="2" y="27" width="40" height="11" viewBox="0 0 20 20" preserveAspectRatio="none">
    <path id="stretched" fill="none" stroke="#157" stroke-width="1.2" d="M2 10 C2 2 18 2 18 10 S2 18 2 10 Z"/>
  </svg>`);
}

/** Every scenario by name. */
export const SCENARIOS: Readonly<Record<string, () => string>> = {
  'traced logo polyline': tracedLogo,
  'CAD outline with rounded corners': cadPlate,
  'Bézier glyph outlines': bezierGlyphs,
  'transformed group (non-uniform scale, mirror)': transformedGroup,
  'nested viewports with preserveAspectRatio': nestedViewports,
};
