/**
 * Issue 6, item 5: seeded property-based fuzzing (fast-check) of refitSvg.
 * Properties: only SvgInputError is ever thrown; every output re-parses
 * (saxes, strict XML) and renders with sharp; every rewritten element's
 * measured deviation (the report's independent measurement) is within the
 * tolerance; with nothing rewritten the text is the input. Run counts are
 * kept small so the file stays well under a minute on a loaded machine.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { SaxesParser } from 'saxes';
import sharp from 'sharp';
import { refitSvg } from '../../src/refit.js';
import { SvgInputError } from '../../src/svg/errors.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const TOL = 0.1;

/** Run refitSvg; null for an SvgInputError, anything else propagates (and fails the property). */
function run(text: string): { text: string; rewritten: number } | null {
  try {
    const r = refitSvg(text, { tolerance: TOL });
    for (const e of r.report.elements) {
      if (!e.kept) expect(e.deviation!.max).toBeLessThanOrEqual(TOL);
    }
    if (r.report.totals.rewritten === 0) expect(r.text).toBe(text);
    // Strict XML (saxes throws on the first well-formedness error).
    new SaxesParser().write(r.text).close();
    return { text: r.text, rewritten: r.report.totals.rewritten };
  } catch (e) {
    if (e instanceof SvgInputError) return null;
    throw e;
  }
}

const num = fc.oneof(
  fc.integer({ min: -200, max: 200 }).map(String),
  fc.double({ min: -200, max: 200, noNaN: true }).map((v) => v.toPrecision(6)),
  fc.constantFrom('0', '.5', '-.5e1', '1e-7', '1e5', '+3', '0.0.1', '1e308', 'NaN', ''),
);
const token = fc.oneof(
  { weight: 6, arbitrary: fc.tuple(fc.constantFrom('M', 'm', 'L', 'l', 'H', 'h', 'V', 'v', 'C', 'c', 'S', 's', 'Q', 'q', 'T', 't'), fc.array(num, { minLength: 1, maxLength: 6 })).map(([c, a]) => `${c}${a.join(' ')}`) },
  { weight: 2, arbitrary: fc.tuple(fc.constantFrom('A', 'a'), num, num, num, fc.constantFrom('0', '1', '2'), fc.constantFrom('0', '1'), num, num).map((t) => `${t[0]}${t.slice(1).join(' ')}`) },
  { weight: 1, arbitrary: fc.constantFrom('Z', 'z', ',', ' ', 'X', '#', '&amp;', '\t\n') },
);
const pathData = fc.array(token, { minLength: 1, maxLength: 25 }).map((ts) => `M 10 10 ${ts.join(' ')}`);

const transform = fc.oneof(
  fc.constant(''),
  fc.tuple(num, num).map(([a, b]) => ` transform="translate(${a} ${b})"`),
  fc.tuple(fc.integer({ min: -360, max: 360 })).map(([a]) => ` transform="rotate(${a})"`),
  fc.tuple(fc.constantFrom('1', '-1', '0.5', '2', '0', '1e-9'), fc.constantFrom('1', '-1', '3')).map(([a, b]) => ` transform="scale(${a} ${b})"`),
  fc.constant(' transform="skewX(30)"'),
  fc.constant(' transform="matrix(0 0 0 0 0 0)"'),
  fc.constant(' transform="bogus(1)"'),
);
const len = fc.oneof(fc.integer({ min: -5, max: 80 }).map(String), fc.constantFrom('10%', '5mm', 'auto', 'x', '1e400'));
const shape = fc.oneof(
  fc.tuple(pathData, transform).map(([d, t]) => `<path d="${d}"${t}/>`),
  fc.tuple(len, len, len, transform).map(([c, r, s, t]) => `<circle cx="${c}" cy="${s}" r="${r}"${t}/>`),
  fc.tuple(len, len, len, len, transform).map(([a, b, c, d, t]) => `<ellipse cx="${a}" cy="${b}" rx="${c}" ry="${d}"${t}/>`),
  fc.tuple(len, len, len, len, transform).map(([a, b, c, d, t]) => `<rect x="${a}" y="${b}" width="${c}" height="${d}" rx="${a}"${t}/>`),
  fc.tuple(fc.array(num, { maxLength: 9 }), fc.constantFrom('polyline', 'polygon')).map(([p, n]) => `<${n} points="${p.join(' ')}"/>`),
);
const node: fc.Arbitrary<string> = fc.letrec<{ node: string }>((tie) => ({
  node: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    shape,
    fc.tuple(fc.array(tie('node'), { maxLength: 3 }), transform, fc.constantFrom('g', 'g', 'defs', 'svg', 'a')).map(([kids, t, n]) => `<${n}${t}>${kids.join('')}</${n}>`),
  ),
})).node;
const document = fc.tuple(fc.array(node, { minLength: 1, maxLength: 4 }), fc.constantFrom('width="100mm" height="80mm" viewBox="0 0 100 80"', '', 'viewBox="0 0 10 10"', 'width="4in" height="1in"'))
  .map(([kids, size]) => `<svg ${NS} ${size}>${kids.join('')}</svg>`);

describe('fuzzing refitSvg (fast-check, seeded)', () => {
  it('random path data: never throws anything but SvgInputError, outputs re-parse, deviation within tolerance', () => {
    fc.assert(fc.property(pathData, (d) => {
      const r = run(`<svg ${NS} width="100mm" height="100mm" viewBox="0 0 100 100"><path d="${d}"/></svg>`);
      expect(r).not.toBeNull(); // a well-formed document with any d is never refused
    }), { seed: 42, numRuns: 150 });
  }, 60_000);

  it('random documents: same properties, and every rewritten output renders with sharp', async () => {
    const pairs: [string, string][] = [];
    fc.assert(fc.property(document, (text) => {
      const r = run(text);
      if (r !== null && r.rewritten > 0 && pairs.length < 25) pairs.push([text, r.text]);
    }), { seed: 42, numRuns: 120 });
    expect(pairs.length).toBeGreaterThan(3);
    let rendered = 0;
    for (const [input, svg] of pairs) {
      // sharp (librsvg) must accept what we wrote whenever it accepts the input
      // (an input without a size it can work out is refused by sharp itself: "bad dimensions").
      const ok = await sharp(Buffer.from(input)).png().toBuffer().then(() => true, () => false);
      if (!ok) continue;
      const png = await sharp(Buffer.from(svg)).png().toBuffer();
      expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
      rendered++;
    }
    expect(rendered).toBeGreaterThan(3);
  }, 60_000);

  it('random junk bytes: only SvgInputError', () => {
    fc.assert(fc.property(fc.string({ maxLength: 200 }), fc.constantFrom('', `<svg ${NS}>`, '<?xml version="1.0"?>'), (s, prefix) => {
      run(prefix + s);
    }), { seed: 42, numRuns: 300 });
  }, 60_000);
});
