/**
 * Copies drawn by `<use>` in machine output (src/machine/copies.ts through
 * refitToMachine), on a file of our own: a symbol (a circle and a curved
 * outline) drawn three times with different transforms, one copy in another
 * colour. The G-code is read by gcode-toolpath and the DXF by dxf-parser (npm,
 * general-purpose readers); the expected centres and radii follow from the
 * transforms by hand (SVG 1.1 §7.4 transform composition, machine Y = 200 − y).
 */
import { describe, expect, it } from 'vitest';
import Toolpath from 'gcode-toolpath';
import DxfParserModule from 'dxf-parser';
import { refitToMachine } from '../../src/refitMachine.js';

const DxfParser = DxfParserModule as unknown as new () => { parseSync(t: string): any };

const SYMBOL = '<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="200mm" height="200mm" viewBox="0 0 200 200">\n' +
  '  <defs><symbol id="part" overflow="visible"><circle r="10"/><path d="M-20 -20C-10 -30 10 -30 20 -20"/></symbol></defs>\n' +
  '  <use xlink:href="#part" x="30" y="30" stroke="#ff0000" fill="none"/>\n' +
  '  <use href="#part" transform="translate(100 60) rotate(45)" stroke="#ff0000" fill="none"/>\n' +
  '  <use href="#part" transform="translate(150 150) scale(1.5)" stroke="#0000ff" fill="none"/>\n</svg>\n';

interface Arc { cx: number; cy: number; r: number; sweep: number }
/** Arcs as gcode-toolpath reads them, with their signed sweep; full circles come as two halves. */
function arcsOf(gcode: string): Arc[] {
  const out: Arc[] = [];
  new Toolpath({
    addArcCurve: (modal, v1, v2, v0) => {
      let s = Math.atan2(v2.y - v0.y, v2.x - v0.x) - Math.atan2(v1.y - v0.y, v1.x - v0.x);
      if (modal.motion === 'G3' && s <= 0) s += 2 * Math.PI;
      if (modal.motion === 'G2' && s >= 0) s -= 2 * Math.PI;
      out.push({ cx: v0.x, cy: v0.y, r: Math.hypot(v1.x - v0.x, v1.y - v0.y), sweep: s });
    },
  }).loadFromStringSync(gcode);
  return out;
}
/** Total turn of the arcs about a centre with a radius (a whole circle: 2π). */
const turnAbout = (arcs: Arc[], cx: number, cy: number, r: number): number => arcs
  .filter((a) => Math.hypot(a.cx - cx, a.cy - cy) < 0.01 && Math.abs(a.r - r) < 0.01)
  .reduce((t, a) => t + Math.abs(a.sweep), 0);

describe('machine output of <use> copies', () => {
  it('writes every copy where its use places it, and nothing where the symbol stands', () => {
    const r = refitToMachine(SYMBOL, { format: 'gcode', tolerance: 0.05 });
    expect(r.report.machine!.checked).toBe(true);
    expect(r.report.warnings.join(' ')).not.toMatch(/use/);
    const arcs = arcsOf(r.text);
    // The circle's centre (0, 0) of the symbol: (30, 30) by x/y; (100, 60) by the translation (a rotation keeps the
    // centre); (150, 150) with radius 1.5 · 10 = 15. Machine Y = 200 − y.
    expect(turnAbout(arcs, 30, 170, 10)).toBeCloseTo(2 * Math.PI, 6);
    expect(turnAbout(arcs, 100, 140, 10)).toBeCloseTo(2 * Math.PI, 6);
    expect(turnAbout(arcs, 150, 50, 15)).toBeCloseTo(2 * Math.PI, 6);
    // The symbol's own place (the origin, machine (0, 200)) draws nothing.
    expect(turnAbout(arcs, 0, 200, 10)).toBe(0);
    // Each copy proven on its own: 2 elements × 3 copies, each measured within the tolerance.
    const proofs = r.machine.proof.elements;
    expect(proofs.map((e) => e.copy ?? 0).sort()).toEqual([1, 1, 2, 2, 3, 3]);
    for (const e of proofs) expect(e.deviation!.max).toBeLessThanOrEqual(0.05);
    for (const e of r.report.elements.filter((x) => x.name === 'circle' || x.name === 'path')) expect(e.status).toBe('refitted');
    // Painting order: the copies in the order of their uses, the blue one last.
    const comments = [...r.text.matchAll(/\(element (\d+) copy (\d) .* stroke (#[0-9a-f]{6})\)/g)].map((m) => `${m[2]}${m[3]}`);
    expect(comments).toEqual(['1#ff0000', '1#ff0000', '2#ff0000', '2#ff0000', '3#0000ff', '3#0000ff']);
  });

  it('puts the copy in another colour on its own DXF layer', () => {
    const dxf = new DxfParser().parseSync(refitToMachine(SYMBOL, { format: 'dxf', tolerance: 0.05 }).text);
    const onLayer = (l: string): any[] => dxf.entities.filter((e: any) => e.layer === l);
    // The blue copy's circle: radius 15 about (150, 50), drawn by ARC entities on the blue layer only.
    const blue = onLayer('STROKE_0000FF').filter((e: any) => e.type === 'ARC');
    expect(blue.some((e: any) => Math.abs(e.radius - 15) < 1e-3 && Math.hypot(e.center.x - 150, e.center.y - 50) < 1e-3)).toBe(true);
    expect(onLayer('STROKE_FF0000').some((e: any) => Math.abs(e.radius - 15) < 1e-3)).toBe(false);
    expect(onLayer('STROKE_FF0000').filter((e: any) => e.type === 'ARC' && Math.abs(e.radius - 10) < 1e-3).length).toBeGreaterThanOrEqual(2);
  });

  it('an element drawn where it stands and by a use is written twice', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">' +
      '<circle id="c" cx="20" cy="20" r="5" fill="none" stroke="#000"/><use href="#c" x="50"/></svg>';
    const r = refitToMachine(svg, { format: 'gcode', tolerance: 0.05 });
    const arcs = arcsOf(r.text);
    expect(turnAbout(arcs, 20, 80, 5)).toBeCloseTo(2 * Math.PI, 6);
    expect(turnAbout(arcs, 70, 80, 5)).toBeCloseTo(2 * Math.PI, 6);
    expect(r.report.machine!.checked).toBe(true);
  });

  it('warns when a copy reaches outside the symbol viewport that clips it in SVG', () => {
    // A symbol's viewport clips its content (SVG 1.1 §5.5, overflow hidden by default): a circle of radius 8 about
    // (5, 5) leaves the 10 × 10 viewport by 3; one of radius 4 stays inside.
    const svg = (r: number): string => '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">' +
      `<symbol id="s" viewBox="0 0 10 10"><circle cx="5" cy="5" r="${r}"/></symbol><use href="#s" x="40" y="40" width="10" height="10" stroke="#000" fill="none"/></svg>`;
    expect(refitToMachine(svg(8), { format: 'gcode' }).report.warnings.join(' ')).toMatch(/circle: 1 copy reaches outside the viewport that clips it/);
    expect(refitToMachine(svg(4), { format: 'gcode' }).report.warnings.join(' ')).not.toMatch(/viewport/);
  });
});
