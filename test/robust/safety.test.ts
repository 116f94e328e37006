/**
 * Issue 6, item 6 (library side): a document with nothing to refit comes back
 * byte-identical, BOM, CR LF line ends, entities, character references,
 * comments, CDATA and odd spacing included; and where something is refitted,
 * everything outside the rewritten attribute stays byte for byte.
 * (The splice writer's own round-trip tests are in test/write/document.test.ts.)
 */
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';

const CIRCLE = 'M10 50C10 27.9 27.9 10 50 10C72.1 10 90 27.9 90 50C90 72.1 72.1 90 50 90C27.9 90 10 72.1 10 50Z';

const PROLOG = '\uFEFF<?xml version="1.0" encoding="UTF-8" standalone="no"?>\r\n' +
  '<!-- Creator: a test, with  double  spaces & "quotes" -->\r\n' +
  '<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd" [\r\n' +
  '  <!ENTITY ns_svg "http://www.w3.org/2000/svg">\r\n  <!ENTITY w "2">\r\n]>\r\n' +
  '<svg   xmlns = "&ns_svg;"  width="100mm" height="100mm"\r\n     viewBox="0 0 100 100" >\r\n' +
  '\t<style><![CDATA[ path { stroke: black } ]]></style>\r\n' +
  '\t<text x=\'1\' y="2">caf&#xE9; &amp; &lt;tag&gt; 😀</text>\r\n';

describe('data safety', () => {
  it('nothing to refit: the output is the input string, byte for byte', () => {
    const text = PROLOG +
      '\t<path d="M 0 0 L &w; 0 L &w; &w;"   stroke-width=\'0.1\'/>\r\n' + // already only lines
      '\t<circle cx="50" cy="50" r="10"/>\r\n' + // exact shape, kept as written
      '\t<defs><path id="x" d="' + CIRCLE + '"/></defs>\r\n' + // not rendered in place
      '</svg>\r\n<!-- trailing comment -->\r\n';
    const r = refitSvg(text);
    expect(r.report.totals.rewritten).toBe(0);
    expect(r.text).toBe(text);
    expect(Buffer.from(r.text, 'utf8').equals(Buffer.from(text, 'utf8'))).toBe(true);
  });

  it('something refitted: only the d attribute value differs, and the mark of the refit is added', () => {
    const tail = '\r\n<!-- trailing comment -->\r\n';
    const text = `${PROLOG}\t<path id="c"\r\n   d="${CIRCLE}" />\r\n</svg>${tail}`;
    const r = refitSvg(text);
    expect(r.report.totals.rewritten).toBe(1);
    const mark = ' data-arcspline-tolerance="0.1"';
    expect(r.text.split(mark).length).toBe(2);
    const out = r.text.replace(mark, '');
    const a = text.indexOf(CIRCLE);
    const b = a + CIRCLE.length;
    expect(out.slice(0, a)).toBe(text.slice(0, a));
    expect(out.endsWith(text.slice(b))).toBe(true);
    expect(out.slice(a, out.length - (text.length - b))).not.toContain('"');
  });

  // A closed line-only path once looked one segment shorter after "fitting" (the Z was
  // counted before but not after) and was rewritten to the same geometry; now it is kept.
  it('a closed path of straight lines only is left as written', () => {
    const text = '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><path d="M 0 0 L 2 0 L 2 2 Z"/></svg>';
    expect(refitSvg(text).text).toBe(text);
  });
});
