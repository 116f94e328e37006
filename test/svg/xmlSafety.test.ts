import { afterEach, describe, expect, it, vi } from 'vitest';
import { readSvg } from '../../src/svg/document.js';
import { SvgInputError } from '../../src/svg/errors.js';
import { createEntityGuard, XML_LIMITS } from '../../src/svg/xmlSafety.js';

const OPTS = { assumedMmPerUnit: 25.4 / 96 };
const NS = 'xmlns="http://www.w3.org/2000/svg"';

function doc(subset: string, body: string): string {
  return `<?xml version="1.0"?>\n<!DOCTYPE svg [\n${subset}\n]>\n<svg ${NS}>${body}</svg>`;
}

/** The error readSvg throws, or null. */
function failure(text: string): SvgInputError | null {
  try {
    readSvg(text, OPTS);
    return null;
  } catch (e) {
    if (e instanceof SvgInputError) return e;
    throw e;
  }
}

describe('xmlSafety (REFERENCES.md §7)', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
  });

  it('X1: billion laughs is refused quickly, before any string is built', () => {
    // CWE-776 / OWASP classic payload, lol … lol9, each entity 10× the previous (REFERENCES.md §7 X1).
    let subset = '<!ENTITY lol "lol">\n';
    for (let k = 1; k <= 9; k++) {
      const prev = k === 1 ? 'lol' : `lol${k - 1}`;
      subset += `<!ENTITY lol${k} "${`&${prev};`.repeat(10)}">\n`;
    }
    const t0 = performance.now();
    const err = failure(doc(subset, '<text>&lol9;</text>'));
    expect(performance.now() - t0).toBeLessThan(500);
    expect(err).not.toBeNull();
    // The nesting-depth cap (4) trips first, at lol5; its lengths were only counted, never built.
    expect(err!.message).toMatch(/entity "lol5" nests references 5 deep \(limit 4\)/);
  });

  it('X1: a wide, shallow laugh is stopped by the per-entity size cap', () => {
    // Same attack with 1000 references per level: lol2 = 3·10⁶ characters > 1 MiB at depth 2.
    const subset = `<!ENTITY lol "lol"><!ENTITY lol1 "${'&lol;'.repeat(1000)}"><!ENTITY lol2 "${'&lol1;'.repeat(1000)}">`;
    const t0 = performance.now();
    const err = failure(doc(subset, '<text>&lol2;</text>'));
    expect(performance.now() - t0).toBeLessThan(500);
    expect(err!.message).toMatch(/entity "lol2" expands to 3000000 characters \(limit 1048576\)/);
  });

  it('X1: the nesting-depth cap refuses a deep but small chain', () => {
    let subset = '<!ENTITY e0 "x">\n';
    for (let k = 1; k <= 4; k++) subset += `<!ENTITY e${k} "&e${k - 1};">\n`;
    const err = failure(doc(`${subset}<!ENTITY e5 "&e4;">`, '<text>&e5;</text>'));
    expect(err!.message).toMatch(/entity "e5" nests references 5 deep \(limit 4\)/);
    // Four levels are allowed and expand correctly.
    const ok = readSvg(doc(subset, '<path d="M0 0&e4;"/>'), OPTS);
    expect(ok.elements[0].attrs.d).toBe('M0 0x');
  });

  it('X2: mutually recursive entities are a fatal error', () => {
    // XML 1.0 §4.1 WFC No Recursion (REFERENCES.md §7 X2).
    const err = failure(doc('<!ENTITY a "&b;"><!ENTITY b "&a;">', '<text>&a;</text>'));
    expect(err!.message).toMatch(/recursive entity "a" \(a → b → a\)/);
    const self = failure(doc('<!ENTITY a "x&a;">', '<text>&a;</text>'));
    expect(self!.message).toMatch(/recursive entity "a"/);
  });

  it('X3: an external (SYSTEM or PUBLIC) entity is refused and nothing is read', () => {
    // OWASP XXE Prevention Cheat Sheet (REFERENCES.md §7 X3).
    const err = failure(doc('<!ENTITY x SYSTEM "file:///etc/passwd">', '<text>&x;</text>'));
    expect(err!.message).toMatch(/external entity "x" \(SYSTEM\) is not allowed/);
    const pub = failure(doc('<!ENTITY x PUBLIC "-//X//EN" "http://example.invalid/x">', '<text>&x;</text>'));
    expect(pub!.message).toMatch(/external entity "x" \(PUBLIC\)/);
    // Parameter entities (and their references) are refused too (§7 checklist).
    expect(failure(doc('<!ENTITY % p "x">', ''))!.message).toMatch(/parameter entity declaration/);
    expect(failure(doc('%p;', ''))!.message).toMatch(/parameter entity reference/);
  });

  it('X4: one large entity referenced many times is stopped by the total-expansion cap', () => {
    // defusedxml "quadratic blowup": 100 kB entity × 10 000 references (REFERENCES.md §7 X4).
    const big = 'a'.repeat(100_000);
    const text = doc(`<!ENTITY big "${big}">`, `<text>${'&big;'.repeat(10_000)}</text>`);
    const t0 = performance.now();
    const err = failure(text);
    expect(performance.now() - t0).toBeLessThan(2000);
    expect(err!.message).toMatch(/expand to more than 8388608 characters/);
    // The budget is parse-global: 84 uses (8.4 MB) already fail, 83 pass.
    expect(failure(doc(`<!ENTITY big "${big}">`, `<text>${'&big;'.repeat(84)}</text>`))).not.toBeNull();
    expect(failure(doc(`<!ENTITY big "${big}">`, `<text>${'&big;'.repeat(83)}</text>`))).toBeNull();
  });

  it('X4: the ratio cap (100 × input) applies to small inputs', () => {
    // libexpat's amplification factor, REFERENCES.md §7: 200 kB from a ~1.7 kB file is over 100×.
    const e = 'b'.repeat(1000);
    const text = doc(`<!ENTITY e "${e}">`, `<text>${'&e;'.repeat(200)}</text>`);
    expect(text.length * 100).toBeLessThan(200_000);
    expect(failure(doc(`<!ENTITY e "${e}">`, `<text>${'&e;'.repeat(100)}</text>`))).toBeNull();
    expect(failure(text)!.message).toMatch(/expand to more than \d+ characters/);
  });

  it('X5: a second DOCTYPE is refused', () => {
    // XML 1.0 [22] prolog (REFERENCES.md §7 X5; CVE-2026-73569 reset counters on repeated DOCTYPEs).
    const err = failure(`<!DOCTYPE svg><!DOCTYPE svg><svg ${NS}/>`);
    expect(err!.message).toMatch(/doctype/i);
    // The guard's own counter, independent of saxes' prolog check:
    const g = createEntityGuard('<svg/>', () => 0);
    g.doctype(' svg', 0);
    expect(() => g.doctype(' svg', 0)).toThrow(/a second DOCTYPE/);
  });

  it('X6: the SVG 1.1 DOCTYPE with its DTD URL parses and nothing is fetched', () => {
    // XML 1.0 §5.1: a non-validating processor need not read the external subset (REFERENCES.md §7 X6).
    const fetchSpy = vi.fn(() => {
      throw new Error('fetch must not be called');
    });
    vi.stubGlobal('fetch', fetchSpy);
    const text = '<?xml version="1.0" standalone="no"?>\n<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN"\n  "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">\n' +
      `<svg ${NS} version="1.1"><path d="M0 0L1 1"/></svg>`;
    const d = readSvg(text, OPTS);
    expect(d.elements).toHaveLength(1);
    expect(d.warnings.some((w) => /DTD/.test(w))).toBe(false);
    expect(fetchSpy).not.toHaveBeenCalled();
    // Another DTD URL is ignored too, with a warning.
    const other = readSvg(`<!DOCTYPE svg SYSTEM "http://example.invalid/x.dtd"><svg ${NS}/>`, OPTS);
    expect(other.warnings.join()).toMatch(/external DTD "http:\/\/example.invalid\/x.dtd" ignored/);
  });

  it('X8: numeric character references count against the caps', () => {
    // GHSA-8gc5-j5rx-235r: character references bypassed the limits (REFERENCES.md §7 X8). 10⁷ × "&#x41;".
    const text = `<svg ${NS}><text>${'&#x41;'.repeat(10_000_000)}</text></svg>`;
    const t0 = performance.now();
    const err = failure(text);
    expect(performance.now() - t0).toBeLessThan(3000);
    expect(err!.message).toMatch(/character references expand to 10000000 characters, more than 8388608/);
  });

  it('internal plain-text entities (authoring tools declare namespace URIs so) are expanded', () => {
    const text = doc(
      '<!ENTITY ns_svg "http://www.w3.org/2000/svg">\n<!ENTITY ns_x "http://ns.example/x">\n<!-- a comment with <!ENTITY fake SYSTEM "no"> -->',
      '',
    ).replace(`<svg ${NS}>`, '<svg xmlns="&ns_svg;" xmlns:x="&ns_x;"><path x:a="1" d="M0&#32;0&amp;"/>');
    const d = readSvg(text, OPTS);
    expect(d.elements[0].attrs.d).toBe('M0 0&');
    expect(d.elements[0].attrs['xmlns:x']).toBeUndefined(); // only on the root
  });

  it('refuses markup in a replacement text and undeclared references', () => {
    expect(failure(doc('<!ENTITY m "<g/>">', ''))!.message).toMatch(/contains markup/);
    expect(failure(doc('<!ENTITY m "&#60;g/>">', ''))!.message).toMatch(/contains markup/);
    expect(failure(doc('<!ENTITY m "&nope;">', ''))!.message).toMatch(/undeclared entity "nope"/);
  });

  it('does not resolve Object.prototype names as entities', () => {
    // saxes' default table inherits from a plain object; ours has no prototype.
    const err = failure(`<svg ${NS}><text>&toString;</text></svg>`);
    expect(err!.message).toMatch(/undefined entity/);
  });

  it('caps the number of declarations', () => {
    let subset = '';
    for (let k = 0; k <= XML_LIMITS.maxEntities; k++) subset += `<!ENTITY e${k} "v">`;
    expect(failure(doc(subset, ''))!.message).toMatch(/more than 1000 entity declarations/);
  });

  it('reports where the problem is', () => {
    const err = failure(doc('<!ENTITY x SYSTEM "file:///etc/passwd">', ''));
    expect(err!.line).toBe(2); // the DOCTYPE line
    expect(err!.column).toBe(1);
    expect(err!.message).toMatch(/^unsafe XML at 2:1: /);
  });
});
