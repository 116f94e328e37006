/**
 * Issue 6, item 2: XML attacks end to end through refitSvg fail fast with a
 * clear one-line message. The caps themselves (exact limits, the 83/84 uses
 * boundary, ratio cap, markup in entities, Object.prototype names, declaration
 * count, error position) are pinned in test/svg/xmlSafety.test.ts; here each
 * attack arrives as a whole file through the public pipeline, and the bound
 * on time is the product guarantee ("fails fast").
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { SvgInputError } from '../../src/svg/errors.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const CIRCLE = 'M10 50C10 27.9 27.9 10 50 10C72.1 10 90 27.9 90 50C90 72.1 72.1 90 50 90C27.9 90 10 72.1 10 50Z';
/** Generous: the refusals take milliseconds; the bound only has to catch an expansion that runs. */
const FAST_MS = 2000;

function doc(subset: string, body: string): string {
  return `<?xml version="1.0"?>\n<!DOCTYPE svg [\n${subset}\n]>\n<svg ${NS} width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`;
}

/** Time and the SvgInputError of refitSvg (anything else fails the test). */
function refuse(text: string): { ms: number; err: SvgInputError } {
  const t0 = performance.now();
  try {
    refitSvg(text);
  } catch (e) {
    if (!(e instanceof SvgInputError)) throw e;
    const ms = performance.now() - t0;
    expect(e.message).not.toMatch(/[\r\n]/);
    return { ms, err: e };
  }
  throw new Error('expected an SvgInputError');
}

describe('XML attacks through refitSvg', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
  });

  it('billion laughs (lol … lol9, CWE-776) in a path attribute', () => {
    // Classic payload, REFERENCES.md §7 X1; here referenced from `d`, where a naive pipeline would also parse it.
    let subset = '<!ENTITY lol "0 0 ">\n';
    for (let k = 1; k <= 9; k++) subset += `<!ENTITY lol${k} "${`&lol${k === 1 ? '' : k - 1};`.repeat(10)}">\n`;
    const { ms, err } = refuse(doc(subset, '<path d="M&lol9;"/>'));
    expect(ms).toBeLessThan(FAST_MS);
    expect(err.message).toMatch(/^unsafe XML at 2:1: entity "lol5" nests references 5 deep/);
  });

  it('quadratic blowup: one 100 kB entity referenced 10 000 times (defusedxml)', () => {
    const big = '0 '.repeat(50_000);
    const { ms, err } = refuse(doc(`<!ENTITY big "${big}">`, `<path d="M${'&big;'.repeat(10_000)}"/>`));
    expect(ms).toBeLessThan(FAST_MS);
    expect(err.message).toMatch(/^unsafe XML at \d+:\d+: entity and character references expand to more than 8388608 characters/);
  });

  it('recursive entities (XML 1.0 §4.1 WFC No Recursion)', () => {
    const { ms, err } = refuse(doc('<!ENTITY a "1 &b;"><!ENTITY b "2 &a;">', '<path d="M&a;"/>'));
    expect(ms).toBeLessThan(FAST_MS);
    expect(err.message).toMatch(/recursive entity "a" \(a → b → a\)/);
  });

  it('external entities to a file and to a URL are refused and nothing is fetched (OWASP XXE)', () => {
    const fetchSpy = vi.fn(() => {
      throw new Error('fetch must not be called');
    });
    vi.stubGlobal('fetch', fetchSpy);
    for (const [decl, re] of [
      ['<!ENTITY x SYSTEM "file:///etc/passwd">', /external entity "x" \(SYSTEM\) is not allowed; nothing is fetched/],
      ['<!ENTITY x SYSTEM "http://127.0.0.1:9/x">', /external entity "x" \(SYSTEM\)/],
      ['<!ENTITY x PUBLIC "-//X//EN" "https://example.invalid/x.ent">', /external entity "x" \(PUBLIC\)/],
      ['<!ENTITY % p SYSTEM "http://example.invalid/p.dtd"> %p;', /parameter entity declaration is not allowed/],
    ] as const) {
      const { ms, err } = refuse(doc(decl, '<text>&x;</text>'));
      expect(ms).toBeLessThan(FAST_MS);
      expect(err.message).toMatch(/^unsafe XML at 2:1: /);
      expect(err.message).toMatch(re);
    }
    expect(fetchSpy).not.toHaveBeenCalled();
  });

  it('a second DOCTYPE (XML 1.0 [22] prolog)', () => {
    const { err } = refuse(`<!DOCTYPE svg [<!ENTITY a "1">]>\n<!DOCTYPE svg [<!ENTITY a "2">]>\n<svg ${NS}><path d="M0 0 L&a; 1"/></svg>`);
    expect(err.message).toMatch(/doctype/i);
  });

  it('ten million numeric character references (GHSA-8gc5-j5rx-235r)', () => {
    const text = `<svg ${NS}><path d="M0 0${'&#32;'.repeat(10_000_000)}L1 1"/></svg>`;
    const { ms, err } = refuse(text);
    expect(ms).toBeLessThan(FAST_MS);
    expect(err.message).toMatch(/^unsafe XML: character references expand to 10000000 characters, more than 8388608/);
  });
});

describe('authoring-tool entities still work', () => {
  it('a file declaring namespace URIs and a style as entities (as Illustrator-style exports do) is refitted', () => {
    // Our own file in the pattern REFERENCES.md §7 describes: namespace names declared in the internal subset.
    const text = '<?xml version="1.0" encoding="utf-8"?>\n' +
      '<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd" [\n' +
      '\t<!ENTITY ns_svg "http://www.w3.org/2000/svg">\n' +
      '\t<!ENTITY ns_xlink "http://www.w3.org/1999/xlink">\n' +
      '\t<!ENTITY ns_extend "http://ns.example.com/Extensibility/1.0/">\n' +
      '\t<!ENTITY st0 "fill:none;stroke:#000000;stroke-width:0.25">\n' +
      ']>\n' +
      '<svg version="1.1" xmlns="&ns_svg;" xmlns:xlink="&ns_xlink;" xmlns:x="&ns_extend;" width="100mm" height="100mm" viewBox="0 0 100 100">\n' +
      `<g id="Layer_1"><path id="c" style="&st0;" d="${CIRCLE}"/></g>\n</svg>\n`;
    const r = refitSvg(text);
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.report.elements[0].deviation!.max).toBeLessThanOrEqual(0.1);
    // Only the d attribute changed: the DOCTYPE, entity references and style reference are byte-identical.
    const dStart = text.indexOf(' d="');
    expect(r.text.slice(0, dStart)).toBe(text.slice(0, dStart));
    expect(r.text.endsWith('"/></g>\n</svg>\n')).toBe(true);
  });
});
