/**
 * Issue 6, item 1: input that is not an SVG document gets a one-line
 * SvgInputError (line:column for XML errors); UTF-8 with BOM and UTF-16 work
 * end to end through decodeSvgBytes + refitSvg.
 * Root-not-svg with a namespace and malformed-XML positions are covered by
 * test/svg/document.test.ts ("readSvg: root and errors"); here the same
 * classes arrive through refitSvg as real-world junk.
 */
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { SvgInputError } from '../../src/svg/errors.js';
import { decodeSvgBytes, detectSvgEncoding } from '../../src/svg/decode.js';
import { checkInputSize, DEFAULT_LIMITS } from '../../src/limits.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const CIRCLE = 'M10 50C10 27.9 27.9 10 50 10C72.1 10 90 27.9 90 50C90 72.1 72.1 90 50 90C27.9 90 10 72.1 10 50Z';
const DOC = `<?xml version="1.0" encoding="UTF-8"?>\n<svg ${NS} width="100mm" height="100mm" viewBox="0 0 100 100"><path id="c" d="${CIRCLE}"/></svg>\n`;

/** The SvgInputError refitSvg throws; any other throw fails the test. */
function refusal(text: string): SvgInputError {
  try {
    refitSvg(text);
  } catch (e) {
    if (e instanceof SvgInputError) return e;
    throw e;
  }
  throw new Error('expected an SvgInputError');
}

// Minimal PNG header: signature + IHDR chunk start (PNG spec, ISO/IEC 15948 §5.2, §11.2.2).
const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0]);

describe('not an SVG: one-line SvgInputError', () => {
  const cases: [string, string, RegExp][] = [
    ['empty text', '', /^XML error at 1:1: .*root element/],
    ['whitespace only', '  \n\t', /^XML error at \d+:\d+: /],
    ['binary junk', '\x00\x01\x02\x7fgarbage\uFFFE', /^XML error at 1:1: disallowed character/],
    ['PNG bytes decoded as latin1', PNG.toString('latin1'), /^XML error at \d+:\d+: /],
    ['an HTML page', '<!DOCTYPE html>\n<html><head><title>x</title></head><body><p>hi<br></body></html>', /^(not an SVG document|XML error) at \d+:\d+: /],
    ['XML with another root', '<?xml version="1.0"?>\n<root><svg/></root>', /^not an SVG document at 2:1: root element is <root>$/],
    ['a JSON file', '{"svg": "<svg/>"}', /^XML error at 1:\d+: text data outside/],
    ['svg cut short', `<svg ${NS}><path d="M0 0 L1 1"/>`, /^XML error at 1:\d+: /],
  ];
  for (const [what, text, re] of cases) {
    it(what, () => {
      const e = refusal(text);
      expect(e.message).toMatch(re);
      expect(e.message).not.toMatch(/[\r\n]/);
      expect(e.line).toBeGreaterThan(0);
      expect(e.column).toBeGreaterThan(0);
    });
  }

  it('an HTML page is refused for its root element when it is well-formed XHTML', () => {
    const e = refusal('<html xmlns="http://www.w3.org/1999/xhtml"><body><svg xmlns="http://www.w3.org/2000/svg"/></body></html>');
    expect(e.message).toBe('not an SVG document at 1:1: root element is <html> in namespace http://www.w3.org/1999/xhtml');
  });
});

describe('decodeSvgBytes: encodings (XML 1.0 §4.3.3 and Appendix F.1)', () => {
  it('UTF-8 with BOM works end to end, and the BOM is kept', () => {
    const bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(DOC, 'utf8')]);
    const text = decodeSvgBytes(bytes);
    expect(text.charCodeAt(0)).toBe(0xfeff);
    const r = refitSvg(text);
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.text.charCodeAt(0)).toBe(0xfeff);
    expect(r.report.elements[0].deviation!.max).toBeLessThanOrEqual(0.1);
  });

  for (const [enc, bom] of [['utf16le', [0xff, 0xfe]], ['utf16be', [0xfe, 0xff]]] as const) {
    it(`UTF-16 ${enc.slice(5).toUpperCase()} with BOM works end to end`, () => {
      const body = DOC.replace('UTF-8', 'UTF-16') + '<!-- é 😀 -->';
      const le = Buffer.from(body, 'utf16le');
      const bytes = Buffer.concat([Buffer.from(bom), enc === 'utf16le' ? le : Buffer.from(le).swap16()]);
      expect(detectSvgEncoding(bytes)).toEqual({ encoding: enc === 'utf16le' ? 'utf-16le' : 'utf-16be', bomBytes: 2 });
      const text = decodeSvgBytes(bytes);
      expect(text).toBe('\uFEFF' + body);
      const r = refitSvg(text);
      expect(r.report.totals.rewritten).toBe(1);
      expect(r.report.elements[0].deviation!.max).toBeLessThanOrEqual(0.1);
    });
  }

  it('UTF-16 without BOM is recognised by "<?" (F.1)', () => {
    const body = DOC.replace('UTF-8', 'UTF-16');
    const le = Buffer.from(body, 'utf16le');
    expect(decodeSvgBytes(le)).toBe(body);
    expect(decodeSvgBytes(Buffer.from(le).swap16())).toBe(body);
  });

  it('plain UTF-8 and ASCII decode unchanged; invalid UTF-8 is refused clearly', () => {
    expect(decodeSvgBytes(Buffer.from(DOC, 'utf8'))).toBe(DOC);
    expect(decodeSvgBytes(Buffer.from('<svg/>é', 'utf8'))).toBe('<svg/>é');
    expect(() => decodeSvgBytes(PNG)).toThrow(SvgInputError);
    expect(() => decodeSvgBytes(PNG)).toThrow(/^not valid UTF-8 text/);
  });

  it('refuses a declared encoding it cannot decode, and odd-length UTF-16', () => {
    const latin = Buffer.from('<?xml version="1.0" encoding="ISO-8859-1"?><svg/>', 'latin1');
    expect(() => decodeSvgBytes(latin)).toThrow(/declares encoding="ISO-8859-1", which arcspline does not decode/);
    expect(() => decodeSvgBytes(Buffer.from([0xff, 0xfe, 0x3c]))).toThrow(/odd number of bytes/);
    // A lone high surrogate is not UTF-16 text.
    expect(() => decodeSvgBytes(Buffer.from([0xff, 0xfe, 0x3c, 0x00, 0x00, 0xd8, 0x3e, 0x00]))).toThrow(/^not valid UTF-16LE text/);
  });
});

describe('checkInputSize (src/limits.ts)', () => {
  it('refuses a 300 MiB input up front (a fake size, nothing allocated) and names the way out', () => {
    let err: unknown = null;
    try {
      checkInputSize(300 * 2 ** 20, {}, 'big.svg');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SvgInputError);
    const m = (err as Error).message;
    expect(m).toMatch(/^big\.svg is too large: 300 MiB \(314572800 bytes\), limit 256 MiB; raise it with the maxInputBytes limit/);
    expect(m).not.toMatch(/\n/);
  });

  it('accepts sizes up to the limit, and a raised limit lets a big size through', () => {
    expect(DEFAULT_LIMITS.maxInputBytes).toBe(256 * 2 ** 20);
    expect(() => checkInputSize(DEFAULT_LIMITS.maxInputBytes)).not.toThrow();
    expect(() => checkInputSize(DEFAULT_LIMITS.maxInputBytes + 1)).toThrow(SvgInputError);
    expect(() => checkInputSize(200 * 2 ** 20)).not.toThrow();
    expect(() => checkInputSize(2 ** 31, { maxInputBytes: 2 ** 32 })).not.toThrow();
    // 0 is a real limit (?? not ||): only an empty input passes.
    expect(() => checkInputSize(0, { maxInputBytes: 0 })).not.toThrow();
    expect(() => checkInputSize(1, { maxInputBytes: 0 })).toThrow(/limit 0 bytes/);
    expect(() => checkInputSize(NaN)).toThrow(RangeError);
  });
});
