/** Comparing two SVG documents: pairing, closed-form distances, units, the verdict and the command. */
import { readFileSync } from 'node:fs';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { afterAll, describe, expect, it } from 'vitest';
import { svgPathProperties } from 'svg-path-properties';
import { compareSvg } from '../../src/measure/compare.js';
import { runCompare } from '../../src/cli/compareCommand.js';
import { refitSvg } from '../../src/refit.js';

const doc = (body: string, size = 'width="100mm" height="100mm" viewBox="0 0 100 100"'): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" ${size}>${body}</svg>`;
const bracket = readFileSync(new URL('../../samples/bracket.svg', import.meta.url), 'utf8');

/** Four standard cubics through (cx±r, cy), (cx, cy±r), handle κ·r. */
function bezierCircle(cx: number, cy: number, r: number): string {
  const k = 0.5522847498307936 * r; // κ = 4/3·(√2 − 1) (REFERENCES.md §6)
  return `M${cx + r} ${cy}C${cx + r} ${cy + k} ${cx + k} ${cy + r} ${cx} ${cy + r}` +
    `C${cx - k} ${cy + r} ${cx - r} ${cy + k} ${cx - r} ${cy}C${cx - r} ${cy - k} ${cx - k} ${cy - r} ${cx} ${cy - r}` +
    `C${cx + k} ${cy - r} ${cx + r} ${cy - k} ${cx + r} ${cy}Z`;
}

describe('compareSvg', () => {
  it('concentric circles: deviation = difference of radii (common geometry)', () => {
    const c = compareSvg(doc('<circle id="c" cx="50" cy="50" r="20"/>'), doc('<circle id="c" cx="50" cy="50" r="20.05"/>'), { tolerance: 0.1 });
    expect(c.pairs).toHaveLength(1);
    const d = c.pairs[0].deviation;
    // Upper bound by construction, within the sampling resolution (tolerance/1000 + chord bounds).
    expect(d.max).toBeGreaterThanOrEqual(0.05 - 1e-9);
    expect(d.max).toBeLessThan(0.05 + 3e-4);
    expect(d.originalToResult).toBeCloseTo(0.05, 3);
    expect(d.resultToOriginal).toBeCloseTo(0.05, 3);
    expect(c.pairs[0].by).toBe('id');
    expect(c.totals.withinTolerance).toBe(true);
    expect(c.whole!.max).toBeCloseTo(d.max, 6);
    const over = compareSvg(doc('<circle cx="50" cy="50" r="20"/>'), doc('<circle cx="50" cy="50" r="20.2"/>'), { tolerance: 0.1 });
    expect(over.pairs[0].withinTolerance).toBe(false);
    expect(over.totals.withinTolerance).toBe(false);
    expect(over.totals.overTolerance).toBe(1);
  });

  it('4-cubic circle against a true circle: 2.7253e-4 r (Bézier-circle literature, REFERENCES.md §6), cross-checked with svg-path-properties', () => {
    const r = 10;
    const c = compareSvg(doc(`<circle cx="50" cy="50" r="${r}"/>`), doc(`<path d="${bezierCircle(50, 50, r)}"/>`), { tolerance: 0.01 });
    const d = c.pairs[0].deviation;
    expect(d.max).toBeGreaterThanOrEqual(2.7253e-4 * r * (1 - 1e-4));
    expect(d.max).toBeLessThan(2.7253e-4 * r + 3e-5);
    // Independent: points along the cubics from a general-purpose npm library, distance to the circle by formula.
    const props = new svgPathProperties(bezierCircle(50, 50, r));
    const len = props.getTotalLength();
    let worst = 0;
    for (let i = 0; i <= 4000; i++) {
      const p = props.getPointAtLength((len * i) / 4000);
      worst = Math.max(worst, Math.abs(Math.hypot(p.x - 50, p.y - 50) - r));
    }
    expect(d.resultToOriginal).toBeGreaterThanOrEqual(worst - 1e-6);
    expect(d.resultToOriginal).toBeLessThan(worst + 3e-5);
  });

  it('pairs by id regardless of order, then by order; lists the unpaired', () => {
    const a = doc('<path id="p" d="M0 0H10"/><path id="q" d="M0 20H10"/><path d="M0 40H10"/><path d="M0 60H10"/>');
    const b = doc('<path id="q" d="M0 20.01H10"/><path id="p" d="M0 0.02H10"/><path d="M0 40.03H10"/>');
    const c = compareSvg(a, b, { tolerance: 0.1 });
    expect(c.pairs.map((p) => [p.a.id ?? p.a.index, p.b.id ?? p.b.index, p.by])).toEqual([['p', 'p', 'id'], ['q', 'q', 'id'], [3, 3, 'order']]);
    // Parallel lines: distance = offset (common geometry).
    expect(c.pairs.map((p) => +p.deviation.max.toFixed(3))).toEqual([0.02, 0.01, 0.03]);
    expect(c.unpairedA.map((e) => e.index)).toEqual([4]);
    expect(c.unpairedB).toEqual([]);
    // The missing line at y = 60 is 19.97 mm from the nearest drawn line of B.
    expect(c.whole!.originalToResult).toBeCloseTo(19.97, 2);
    expect(c.totals.withinTolerance).toBe(false);
  });

  it('order pairs do not decide the verdict when the element structure differs', () => {
    // A program that merged two paths into one: the drawing matches, order pairs do not.
    const a = doc('<path d="M0 0H10"/><path d="M0 20H10"/>');
    const b = doc('<path d="M0 20H10M0 0H10"/>');
    const c = compareSvg(a, b, { tolerance: 0.1 });
    expect(c.pairs[0].withinTolerance).toBe(false);
    expect(c.unpairedA).toHaveLength(1);
    expect(c.whole!.max).toBeLessThan(1e-3);
    expect(c.totals.withinTolerance).toBe(true);
  });

  it('measures in mm: the same drawing at another user-unit scale and under a transform matches', () => {
    const a = doc('<path d="M10 10L60 10A20 20 0 0 1 60 50Z"/>');
    // User unit = 0.1 mm, and the path under a group transform that undoes a ×2 scale.
    const b = doc('<g transform="scale(0.5)"><path d="M200 200L1200 200A400 400 0 0 1 1200 1000Z"/></g>', 'width="100mm" height="100mm" viewBox="0 0 1000 1000"');
    const c = compareSvg(a, b, { tolerance: 0.05 });
    expect(c.pairs[0].deviation.max).toBeLessThan(1e-4);
    expect(c.pairs[0].deviation.worstUser[0]).toBeGreaterThan(150); // in B's user units, not mm
  });

  it('refit output of the sample against its original: the same figures as the report', () => {
    const r = refitSvg(bracket, {}, 'bracket.svg');
    const c = compareSvg(bracket, r.text, { tolerance: 0.1 });
    expect(c.unpairedA).toEqual([]);
    expect(c.unpairedB).toEqual([]);
    for (const e of r.report.elements) {
      const p = c.pairs.find((x) => x.a.index === e.index)!;
      if (e.deviation !== null) expect(p.deviation.max).toBeCloseTo(e.deviation.max, 9);
      else expect(p.deviation.max).toBeLessThan(1e-3); // kept as written: only sampling slack
    }
    expect(c.totals.withinTolerance).toBe(true);
    // Exactly, the whole-drawing distance is at most the largest pair's; the bounds differ by
    // the sampling slack (chord bounds of both sides + resolution, each ≤ tolerance/1000).
    expect(c.whole!.max).toBeLessThanOrEqual(r.report.totals.maxDeviation + 3e-4);
  });

  it('ignores what is not rendered and what draws nothing', () => {
    const a = doc('<defs><path id="d" d="M0 0H50"/></defs><path d="M0 0"/><path d="M5 5H9"/>');
    const c = compareSvg(a, doc('<path d="M5 5H9"/>'), { tolerance: 0.1 });
    expect(c.pairs).toHaveLength(1);
    expect(c.unpairedA).toEqual([]);
    expect(compareSvg(doc(''), doc(''), { tolerance: 0.1 }).totals.withinTolerance).toBe(true);
    expect(compareSvg(doc(''), doc('<path d="M5 5H9"/>'), { tolerance: 0.1 }).totals.withinTolerance).toBe(false);
  });

});

describe('runCompare', () => {
  const dir = mkdtempSync(join(tmpdir(), 'arcspline-compare-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const file = (name: string, text: string): string => {
    const p = join(dir, name);
    writeFileSync(p, text);
    return p;
  };
  const collect = () => {
    const chunks: Buffer[] = [];
    const stream = new Writable({ write(c, _e, cb) { chunks.push(Buffer.from(c)); cb(); } });
    return { stream, text: () => Buffer.concat(chunks).toString('utf8') };
  };
  const run = async (a: string, b: string, json = false, tolerance = 0.1) => {
    const out = collect(), err = collect();
    const code = await runCompare(a, b, { tolerance, json }, { stdout: out.stream, stderr: err.stream });
    return { code, stdout: out.text(), stderr: err.text() };
  };
  const a = file('a.svg', doc('<circle id="c" cx="50" cy="50" r="20"/>'));
  const near = file('near.svg', doc('<circle id="c" cx="50" cy="50" r="20.05"/>'));
  const far = file('far.svg', doc('<circle id="c" cx="50" cy="50" r="20.5"/>'));

  it('exit 0 within tolerance, 1 over it, with the table on stdout', async () => {
    const ok = await run(a, near);
    expect(ok.code).toBe(0);
    expect(ok.stdout).toContain('within tolerance');
    expect(ok.stderr).toBe('');
    const bad = await run(a, far);
    expect(bad.code).toBe(1);
    expect(bad.stdout).toContain('NOT within tolerance');
  });

  it('JSON output parses and carries the figures', async () => {
    const r = await run(a, near, true);
    const j = JSON.parse(r.stdout);
    expect(j.a).toBe(a);
    expect(j.pairs[0].deviation.max).toBeCloseTo(0.05, 3);
    expect(j.totals.withinTolerance).toBe(true);
  });

  it('exit 2 with one line for a missing file, a non-SVG file and a bad tolerance', async () => {
    const missing = await run(join(dir, 'nope.svg'), a);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/nope\.svg.*no such file/);
    expect(missing.stderr.trim().split('\n')).toHaveLength(1);
    const notSvg = await run(a, file('x.svg', '<html/>'));
    expect(notSvg.code).toBe(2);
    expect(notSvg.stderr).toMatch(/x\.svg: .*not an SVG/);
    const broken = await run(file('broken.svg', '<svg xmlns="http://www.w3.org/2000/svg"><path'), a);
    expect(broken.code).toBe(2);
    expect(broken.stderr).toContain('broken.svg');
    expect((await run(a, near, false, 0)).code).toBe(2);
  });
});
