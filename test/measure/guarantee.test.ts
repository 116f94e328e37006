/**
 * The guarantee: nothing is ever written over the tolerance. A fit that is
 * wrong (forced here by wrapping the real fitter) is caught by the independent
 * measurement, and the contour comes back as straight moves (or, failing that,
 * the element is written back byte for byte and flagged);
 * hostile-but-valid geometry either comes out within the bound or unchanged.
 */
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { compareSvg } from '../../src/measure/compare.js';
import { readSvg } from '../../src/svg/document.js';

/** Sabotage switch for the wrapped fitter: which contours to move, and how. */
const sabotage = vi.hoisted(() => ({
  /** Contours whose first vertex has x (mm) above this are moved; Infinity = none. */
  minX: Infinity,
  /** mm added to y of the moved vertices. */
  dy: 0,
  /** Which share of the vertices moves: 'all' (the whole fit is off) or 'middle' (one stretch is). */
  part: 'all' as 'all' | 'middle',
  calls: 0,
}));

vi.mock('../../src/fit/fitPolyline.js', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../src/fit/fitPolyline.js')>();
  return {
    ...real,
    fitPolyline: (xy: Float64Array, opts: Parameters<typeof real.fitPolyline>[1]) => {
      if (!(xy[0] > sabotage.minX)) return real.fitPolyline(xy, opts);
      sabotage.calls++;
      // The real fitter, run on input moved by dy: a faithful fit of the wrong place.
      const moved = xy.slice();
      const n = xy.length >> 1;
      const [i0, i1] = sabotage.part === 'all' ? [0, n] : [Math.floor(n / 3), Math.floor((2 * n) / 3)];
      for (let i = i0; i < i1; i++) moved[2 * i + 1] += sabotage.dy;
      return real.fitPolyline(moved, opts);
    },
  };
});

const TOL = 0.1;
const doc = (body: string, size = 'width="200mm" height="100mm" viewBox="0 0 200 100"'): string =>
  `<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" ${size}>\n${body}\n</svg>\n`;

/** The start tag of every element of `text` by index, as written. */
function startTags(text: string): Map<number, string> {
  const d = readSvg(text, { assumedMmPerUnit: 1 });
  return new Map(d.elements.map((e) => [e.index, text.slice(e.startTag[0], e.startTag[1])]));
}

/** Every rewritten element within the bound, every kept one unchanged, and the output re-measured agrees. */
function checkHonest(input: string, tol: number): ReturnType<typeof refitSvg> {
  const r = refitSvg(input, { tolerance: tol });
  const before = startTags(input), after = startTags(r.text);
  for (const e of r.report.elements) {
    if (e.kept) expect(after.get(e.index), `kept element ${e.index}`).toBe(before.get(e.index));
    else expect(e.deviation!.max, `element ${e.index}`).toBeLessThanOrEqual(tol);
  }
  // Measured again from the two texts alone, pairing by document order.
  const c = compareSvg(input, r.text, { tolerance: tol });
  for (const p of c.pairs) expect(p.deviation.max, `pair ${p.a.index}`).toBeLessThanOrEqual(tol);
  expect(c.unpairedA).toEqual([]);
  return r;
}

beforeEach(() => {
  sabotage.minX = Infinity;
  sabotage.calls = 0;
});

describe('a wrong fit is caught, kept and flagged', () => {
  const target = '<path id="target" d="M100 50 C100 30 120 20 140 20 S 180 40 190 60"/>';
  const input = doc(`<path id="a" d="M10 50 C10 30 30 20 50 20 S 80 40 90 60"/>\n${target}\n<polygon id="b" points="10,90 30,80 50,78 70,80 90,90"/>`);

  it.each(['all', 'middle'] as const)('moving %s of the fit by 3× the tolerance', (part) => {
    sabotage.minX = 95;
    sabotage.dy = 3 * TOL;
    sabotage.part = part;
    const r = refitSvg(input, { tolerance: TOL });
    expect(sabotage.calls).toBeGreaterThan(0); // the sabotage did run
    // The element's measurement finds it over; measured contour by contour, the wrong spline is dropped
    // and the contour comes back as straight moves through its own vertices: never the wrong fit.
    const t = r.report.elements.find((e) => e.id === 'target')!;
    expect(t.kept).toBe(false);
    expect(t.segmentsAfter.arcs).toBe(0);
    expect(t.deviation!.max).toBeLessThanOrEqual(TOL);
    expect(r.report.totals.withinTolerance).toBe(true);
    // The Bézier beside it is still rewritten within the bound; the polygon's lines are already no more
    // than a refit needs, so it is kept as written.
    const a = r.report.elements.find((x) => x.id === 'a')!;
    expect(a.kept).toBe(false);
    expect(a.deviation!.max).toBeLessThanOrEqual(TOL);
    expect(r.report.elements.find((x) => x.id === 'b')!.reason).toBe('no-shorter');
    expect(r.text).not.toContain('S 80 40 90 60');
    // The written file as a whole is within the tolerance of the input.
    expect(compareSvg(input, r.text, { tolerance: TOL }).totals.withinTolerance).toBe(true);
  });

  it('a sabotage within the bound is accepted (the check is not simply always failing)', () => {
    sabotage.minX = 95;
    sabotage.dy = 0.2 * TOL;
    sabotage.part = 'all';
    const r = refitSvg(input, { tolerance: TOL });
    expect(sabotage.calls).toBeGreaterThan(0);
    expect(r.report.elements.find((e) => e.id === 'target')!.kept).toBe(false);
    expect(r.report.totals.withinTolerance).toBe(true);
  });
});

describe('hostile but valid geometry never comes out over the bound', () => {
  const zigzag = (n: number, step: number, amp: number, y: number): string => {
    const pts: string[] = [];
    for (let i = 0; i <= n; i++) pts.push(`${(10 + i * step).toFixed(4)},${(y + (i % 2) * amp).toFixed(4)}`);
    return pts.join(' ');
  };
  const both = [0.1, 0.01];
  const cases: [string, string, number[]][] = [
    ['a spike 30 mm tall and 1 µm wide', '<polyline points="10,80 30,80 49.9995,80 50,50 50.0005,80 70,80 90,80"/><path d="M10 60 C40 60 49.999 60 50 30 C50.001 60 60 60 90 60"/>', both],
    ['a zig-zag of 1e4 steps of 10 µm, 5 µm high', `<polyline points="${zigzag(10_000, 0.01, 0.005, 40)}"/>`, both],
    ['a zig-zag of 1e4 steps of 10 µm, 0.5 mm high', `<polyline points="${zigzag(10_000, 0.01, 0.5, 60)}"/>`, both],
    ['a 1e-3 mm circle and a 1e-3 mm bump', '<path d="M100.001 50 A0.001 0.001 0 0 1 99.999 50 A0.001 0.001 0 0 1 100.001 50Z"/><path d="M10 20 L50 20 C50 19.999 50.002 19.999 50.002 20 L90 20"/>', both],
    ['a curve 1e6 mm away', '<g transform="translate(1000000 1000000)"><path d="M0 0 C10 -20 30 -20 40 0 S 70 20 80 0"/><path d="M60 50A10 10 0 0 1 40 50A10 10 0 0 1 60 50Z"/></g>', both],
  ];
  it.each(cases)('%s', (_name, body, tolerances) => {
    for (const tol of tolerances) {
      const input = doc(body);
      const r = checkHonest(input, tol);
      // Every element went through the fitter and the check (none was kept before fitting).
      // (or was kept as written because its lines and arcs are already no more than a refit needs).
      for (const e of r.report.elements) if (e.reason !== 'no-shorter') expect(e.deviation, `element ${e.index} at ${tol} mm`).not.toBeNull();
      expect(r.report.elements.every((e) => e.status === 'refitted' || e.reason === 'no-shorter'), `at ${tol} mm`).toBe(true);
    }
  });

  it('as paths too: shapes rewritten as paths under a skewing transform', () => {
    const input = doc('<g transform="skewX(30) scale(1 0.5)"><circle cx="50" cy="50" r="20"/><rect x="100" y="20" width="40" height="30" rx="5"/><ellipse cx="60" cy="150" rx="30" ry="0.01"/></g>');
    const r = refitSvg(input, { tolerance: TOL, shapesAsPaths: true });
    for (const e of r.report.elements) if (!e.kept) expect(e.deviation!.max).toBeLessThanOrEqual(TOL);
    expect(r.report.totals.rewritten).toBeGreaterThan(0);
    checkHonest(input, TOL);
  });
});
