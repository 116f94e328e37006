import { describe, expect, it } from 'vitest';
import { readSvg, type GeometryElement } from '../../src/svg/document.js';
import { lineColumnAt, SvgInputError } from '../../src/svg/errors.js';

const OPTS = { assumedMmPerUnit: 25.4 / 96 };
const NS = 'xmlns="http://www.w3.org/2000/svg"';

function apply(m: Float64Array, x: number, y: number): [number, number] {
  return [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
}

function failure(text: string): SvgInputError {
  try {
    readSvg(text, OPTS);
  } catch (e) {
    if (e instanceof SvgInputError) return e;
    throw e;
  }
  throw new Error('expected an SvgInputError');
}

function tagText(text: string, el: GeometryElement): [string, string | null] {
  return [text.slice(el.startTag[0], el.startTag[1]), el.endTag ? text.slice(el.endTag[0], el.endTag[1]) : null];
}

describe('readSvg: source offsets', () => {
  it('are string indices into the original text, with a BOM, astral characters and CR LF', () => {
    // saxes counts `position` in UTF-16 code units and counts the BOM it skips (checked here, not assumed).
    const text = `\uFEFF<svg ${NS}>\r\n<!-- é 😀 -->\r\n<text>😀é</text><path d="M0 0" a="😀>"></path >\r\n<g><circle r="1"\r\n/></g></svg>`;
    const d = readSvg(text, OPTS);
    expect(d.elements.map((e) => e.name)).toEqual(['path', 'circle']);
    expect(tagText(text, d.elements[0])).toEqual(['<path d="M0 0" a="😀>">', '</path >']);
    expect(tagText(text, d.elements[1])).toEqual(['<circle r="1"\r\n/>', null]);
    expect(d.elements[0].attrs.a).toBe('😀>');
    expect(d.text).toBe(text);
  });

  it('index counts every element in document order, root = 0', () => {
    const d = readSvg(`<svg ${NS}><g><title>t</title><rect width="1" height="1"/></g><x:y xmlns:x="urn:x"/><line/></svg>`, OPTS);
    expect(d.elements.map((e) => [e.name, e.index])).toEqual([['rect', 3], ['line', 5]]);
  });
});

describe('readSvg: root and errors', () => {
  it('refuses a root that is not svg', () => {
    const e = failure('<html xmlns="http://www.w3.org/1999/xhtml"/>');
    expect(e.message).toBe('not an SVG document at 1:1: root element is <html> in namespace http://www.w3.org/1999/xhtml');
    expect(failure('<svg xmlns="urn:other"/>').message).toMatch(/root element is <svg> in namespace urn:other/);
  });

  it('accepts a prefixed svg:svg in the SVG namespace, and ignores geometry in other namespaces', () => {
    const d = readSvg('<s:svg xmlns:s="http://www.w3.org/2000/svg" xmlns:o="urn:o"><s:path d="M0 0"/><o:path d="M1 1"/></s:svg>', OPTS);
    expect(d.elements.map((e) => e.attrs.d)).toEqual(['M0 0']);
    expect(d.warnings.join()).not.toMatch(/xmlns/);
  });

  it('resolves namespaces per element: unbound prefixes are errors, xmlns="" leaves SVG (Namespaces in XML 1.0 §6.2)', () => {
    expect(failure(`<svg ${NS}><q:path/></svg>`).message).toMatch(/^XML error at 1:\d+: unbound namespace prefix in <q:path>$/);
    const d = readSvg(`<svg ${NS}><g xmlns=""><path d="M1 1"/><g xmlns="http://www.w3.org/2000/svg"><path d="M2 2"/></g></g></svg>`, OPTS);
    expect(d.elements.map((e) => e.attrs.d)).toEqual(['M2 2']);
    expect(d.elements[0].reason).toBe('inside <g> (not SVG)');
  });

  it('reads an svg without a namespace, with a warning', () => {
    const d = readSvg('<svg><path d="M0 0"/></svg>', OPTS);
    expect(d.elements).toHaveLength(1);
    expect(d.warnings.join()).toMatch(/no xmlns/);
  });

  it('reports malformed XML with a 1-based line and column', () => {
    const e = failure(`<svg ${NS}>\n  <g>\n    <path/>\n</svg>`);
    expect(e.message).toMatch(/^XML error at 4:\d+: unexpected close tag$/);
    expect(e.line).toBe(4);
    expect(failure('').message).toMatch(/^XML error at 1:1: document must contain a root element$/);
  });
});

describe('lineColumnAt', () => {
  it('counts CR LF, CR and LF as one line end (XML 1.0 §2.11) and columns in code points', () => {
    const t = 'a\r\nb\rc\n😀é<';
    expect(lineColumnAt(t, 0)).toEqual({ line: 1, column: 1 });
    expect(lineColumnAt(t, 3)).toEqual({ line: 2, column: 1 });
    expect(lineColumnAt(t, 5)).toEqual({ line: 3, column: 1 });
    expect(lineColumnAt(t, t.length - 1)).toEqual({ line: 4, column: 3 }); // '<' after an astral character and é
  });

  it('places an XML error after non-ASCII text on the right column', () => {
    const e = failure(`<svg ${NS}>\r\n😀é<g></svg>`);
    expect(e.message).toBe('XML error at 2:11: unexpected close tag');
  });
});

describe('readSvg: coordinate systems', () => {
  it('composes CTM = ancestors outermost first · own (CT1 #transform-function-lists)', () => {
    const text = `<svg ${NS}><g transform="translate(10 0)"><g transform="scale(2)"><path transform="rotate(90)" d=""/></g></g></svg>`;
    const [p] = readSvg(text, OPTS).elements;
    // (1, 0) → rotate(90) (0, 1) → scale(2) (0, 2) → translate (10, 2). Hand-computed from REFERENCES.md §5.1.
    const [x, y] = apply(p.ctm, 1, 0);
    expect(x).toBeCloseTo(10, 12);
    expect(y).toBeCloseTo(2, 12);
  });

  it('V1: 100mm × 50mm with viewBox 0 0 100 50 gives 1 user unit = 1 mm (CV3 + S2 §8.2)', () => {
    const d = readSvg(`<svg ${NS} width="100mm" height="50mm" viewBox="0 0 100 50"><line/></svg>`, OPTS);
    expect(d.physicalSize).toBe(true);
    const [x, y] = apply(d.elements[0].toMm, 30, 40);
    expect(x).toBeCloseTo(30, 9);
    expect(y).toBeCloseTo(40, 9);
  });

  it('V2: 4in × 2in, viewBox 0 0 400 100: ty = 48 px, 1 uu = 0.254 mm (S2 §8.2)', () => {
    const d = readSvg(`<svg ${NS} width="4in" height="2in" viewBox="0 0 400 100"><g><line/></g></svg>`, OPTS);
    const m = d.elements[0].toMm;
    expect(m[0]).toBeCloseTo(0.254, 12);
    expect(m[5]).toBeCloseTo(48 * 25.4 / 96, 12);
    expect(d.elements[0].viewportW).toBe(400);
    expect(d.elements[0].viewportH).toBe(100);
  });

  it('a root transform acts in the viewport (px) space, outside the viewBox (S2 §8.6)', () => {
    const d = readSvg(`<svg ${NS} width="100mm" height="50mm" viewBox="0 0 100 50" transform="translate(96 0)"><line/></svg>`, OPTS);
    const [x] = apply(d.elements[0].toMm, 0, 0);
    expect(x).toBeCloseTo(25.4, 9); // 96 px = 1 in
    expect(Array.from(d.elements[0].ctm)).toEqual([1, 0, 0, 1, 0, 0]);
  });

  it('a nested svg maps its viewBox into x, y, width, height of the parent (S2 §8.2, §8.8)', () => {
    const text = `<svg ${NS} viewBox="0 0 200 100" width="200" height="100">` +
      '<svg x="10" y="20" width="50%" height="50" viewBox="0 0 100 100"><path d="" /></svg>' +
      '<svg x="5" y="6"><rect width="10%" height="1"/></svg></svg>';
    const [p, r] = readSvg(text, OPTS).elements;
    // width 50% of 200 = 100, height 50: meet → scale 0.5; xMid: tx = 10 + (100 − 50)/2 = 35; ty = 20.
    expect(Array.from(p.ctm)).toEqual([0.5, 0, 0, 0.5, 35, 20]);
    expect([p.viewportW, p.viewportH]).toEqual([100, 100]);
    // No viewBox: only translate(x, y), and the viewport is 100% of the parent's.
    expect(Array.from(r.ctm)).toEqual([1, 0, 0, 1, 5, 6]);
    expect([r.viewportW, r.viewportH]).toEqual([200, 100]);
  });
});

describe('readSvg: what is left untouched', () => {
  const text = `<svg ${NS} xmlns:x="urn:x">` +
    '<defs><path id="d0" d=""/><path id="d1" d=""/></defs><clipPath><rect/></clipPath><symbol><circle/></symbol>' +
    '<g display="none"><line/></g><g style="fill:red; display : none"><polyline/></g>' +
    '<g transform="scale(0)"><polygon/></g><g transform="rotate(oops)"><ellipse/></g>' +
    '<text><path d=""/></text><x:group><path d=""/></x:group>' +
    '<use href="#d1"/><g id="ok"><path id="p" d=""/></g></svg>';
  const els = readSvg(text, OPTS).elements;
  const reasons = els.filter((e) => e.id !== 'd1').map((e) => e.reason);

  it('marks each case with a reason', () => {
    expect(reasons.slice(0, 9)).toEqual([
      'inside <defs> (not rendered in place)',
      'inside <clipPath> (not rendered in place)',
      'inside <symbol> (not rendered in place)',
      'display: none on <g>',
      'display: none on <g>',
      'singular transform at <g> (not displayed)',
      expect.stringMatching(/^invalid transform on <g>: /),
      'inside <text> (not a container)',
      'inside <x:group> (not SVG)',
    ]);
    expect(els.filter((e) => e.id !== 'd1').slice(0, 9).every((e) => !e.rewritable)).toBe(true);
  });

  it('leaves rendered geometry rewritable; what a drawn use draws from defs is rewritable too', () => {
    const last = els[els.length - 1];
    expect(els).toHaveLength(11);
    expect(els[1]).toMatchObject({ id: 'd1', rewritable: true, reason: null, drawnByUse: true });
    expect(last).toMatchObject({ id: 'p', rewritable: true, reason: null, ancestors: 'svg > g#ok' });
  });
});

describe('readSvg: size and depth', () => {
  it('handles 100 000 nested groups without recursion', () => {
    const n = 100_000;
    const text = `<svg ${NS}>${'<g transform="translate(1 0)">'.repeat(n)}<path d=""/>${'</g>'.repeat(n)}</svg>`;
    const d = readSvg(text, OPTS);
    expect(d.elements[0].ctm[4]).toBe(n);
    expect(d.elements[0].ancestors.startsWith('svg > … > g')).toBe(true);
  });

  it('reads 18 MB with 400 paths, each found once', () => {
    // Seeded LCG so the file is the same every run.
    let seed = 12345;
    const rnd = (): number => ((seed = (seed * 1103515245 + 12345) >>> 0) / 4294967296) * 1000;
    const parts: string[] = [`<svg ${NS} width="500mm" height="500mm" viewBox="0 0 1000 1000">`];
    for (let k = 0; k < 400; k++) {
      let d = 'M0 0';
      while (d.length < 45_000) d += `L${rnd().toFixed(3)} ${rnd().toFixed(3)}`;
      parts.push(`<g transform="translate(${k} 0)"><path id="p${k}" d="${d}"/></g>`);
    }
    parts.push('</svg>');
    const text = parts.join('\n');
    expect(text.length).toBeGreaterThan(18_000_000);
    // Its speed is benchmarked (npm run bench: the pipeline's parse stage), not timed here.
    const n = readSvg(text, OPTS).elements.length;
    expect(n).toBe(400);
  });
});
