import { describe, expect, it } from 'vitest';
import { SaxesParser } from 'saxes';
import { readSvg } from '../../src/svg/document.js';
import { applyEdits, editStartTag, escapeAttr } from '../../src/write/document.js';

const OPTS = { assumedMmPerUnit: 25.4 / 96 };

/** A document using every kind of XML construct around the geometry. */
const RICH =
  '\uFEFF<?xml version="1.0" encoding="UTF-8" standalone="no"?>\r\n' +
  '<!-- Created with a drawing program: é 😀 -->\r\n' +
  '<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd" [\r\n' +
  '  <!ENTITY ns_svg "http://www.w3.org/2000/svg">\r\n' +
  '  <!ENTITY ns_x "urn:example:x">\r\n' +
  ']>\r\n' +
  '<?xml-stylesheet type="text/css" href="s.css"?>\r\n' +
  '<svg xmlns="&ns_svg;" xmlns:x="&ns_x;" width="100mm" height="50mm" viewBox="0 0 100 50">\r\n' +
  '  <x:meta x:a=\'1\'>text &amp; more</x:meta>\r\n' +
  '  <style><![CDATA[ path { stroke: red } /* <not markup> */ ]]></style>\r\n' +
  '  <?pi-target some data?>\r\n' +
  '  <g id="l1"\ttransform = "translate(1,2)" >\r\n' +
  '    <path  id="a" d = \'M0 0 L10 10\'\r\n      x:keep="&ns_x;"   fill="none"   />\r\n' +
  '    <circle cx="5" cy="5" r="2" ></circle>\r\n' +
  '  </g>\r\n' +
  '</svg>\r\n<!-- trailing -->\r\n';

describe('applyEdits', () => {
  it('applies non-overlapping edits in any order', () => {
    expect(applyEdits('abcdef', [{ start: 4, end: 5, text: 'E' }, { start: 0, end: 1, text: 'AA' }, { start: 3, end: 3, text: '-' }])).toBe('AAbc-dEf');
  });

  it('returns the text itself with no edits, and refuses overlaps', () => {
    expect(applyEdits(RICH, [])).toBe(RICH);
    expect(() => applyEdits('abcdef', [{ start: 1, end: 3, text: '' }, { start: 2, end: 4, text: '' }])).toThrow(RangeError);
    expect(() => applyEdits('abc', [{ start: 2, end: 9, text: '' }])).toThrow(RangeError);
  });
});

describe('escapeAttr', () => {
  it('escapes &, <, the quote in use and line ends (XML 1.0 §3.3.3 normalisation)', () => {
    expect(escapeAttr('a&b<c"d\'e\tf\ng\r')).toBe('a&amp;b&lt;c&quot;d\'e&#9;f&#10;g&#13;');
    expect(escapeAttr('"\'', "'")).toBe('"&apos;');
  });
});

describe('editStartTag on a document with every XML construct', () => {
  const doc = readSvg(RICH, OPTS);
  const [path, circle] = doc.elements;

  it('a document without edits comes back byte-identical', () => {
    expect(applyEdits(RICH, editStartTag(RICH, path, {}))).toBe(RICH);
    // Setting a value to its current raw text is no edit either.
    expect(editStartTag(RICH, path, { set: { fill: 'none' } })).toEqual([]);
  });

  it('changing one value changes only the bytes of that value, keeping its quotes', () => {
    const out = applyEdits(RICH, editStartTag(RICH, path, { set: { d: 'M0 0 A5 5 0 0 1 10 10' } }));
    const at = RICH.indexOf("M0 0 L10 10");
    expect(out.slice(0, at)).toBe(RICH.slice(0, at));
    expect(out.slice(at + 'M0 0 L10 10'.length + 10)).toBe(RICH.slice(at + 'M0 0 L10 10'.length));
    expect(out).toContain("d = 'M0 0 A5 5 0 0 1 10 10'\r\n      x:keep");
    // The result is still well-formed and reads back to the new value (saxes as the independent reader).
    expect(readSvg(out, OPTS).elements[0].attrs.d).toBe('M0 0 A5 5 0 0 1 10 10');
  });

  it('escapes a new value for the quote already used', () => {
    const out = applyEdits(RICH, editStartTag(RICH, path, { set: { d: "it's <&>" } }));
    expect(out).toContain("d = 'it&apos;s &lt;&amp;>'");
    expect(readSvg(out, OPTS).elements[0].attrs.d).toBe("it's <&>");
  });

  it('appends a new attribute after the last one, keeping the space before />', () => {
    const out = applyEdits(RICH, editStartTag(RICH, path, { set: { 'x:fit': 'a"b' } }));
    expect(out).toContain('fill="none" x:fit="a&quot;b"   />');
    expect(readSvg(out, OPTS).elements[0].attrs['x:fit']).toBe('a"b');
  });

  it('removes an attribute with its leading whitespace', () => {
    const out = applyEdits(RICH, editStartTag(RICH, path, { remove: ['fill', 'x:keep'] }));
    expect(out).toContain("<path  id=\"a\" d = 'M0 0 L10 10'   />");
    expect(() => editStartTag(RICH, path, { set: { fill: 'red' }, remove: ['fill'] })).toThrow(/both set and removed/);
  });

  it('renames start and end tag together; other edits combine', () => {
    const edits = [
      ...editStartTag(RICH, circle, { rename: 'path', set: { d: 'M3 5a2 2 0 1 0 4 0a2 2 0 1 0-4 0' }, remove: ['cx', 'cy', 'r'] }),
      ...editStartTag(RICH, path, { set: { d: 'M1 1' } }),
    ];
    const out = applyEdits(RICH, edits);
    expect(out).toContain('<path d="M3 5a2 2 0 1 0 4 0a2 2 0 1 0-4 0" ></path>');
    const again = readSvg(out, OPTS);
    expect(again.elements.map((e) => e.name)).toEqual(['path', 'path']);
    // Everything outside the two elements is unchanged.
    const tail = RICH.indexOf('\r\n  </g>');
    expect(out.slice(out.indexOf('\r\n  </g>'))).toBe(RICH.slice(tail));
  });

  it('keeps the prefix of a prefixed element when renaming', () => {
    const text = '<s:svg xmlns:s="http://www.w3.org/2000/svg"><s:circle r="1"></s:circle></s:svg>';
    const [c] = readSvg(text, OPTS).elements;
    expect(applyEdits(text, editStartTag(text, c, { rename: 'path' }))).toBe('<s:svg xmlns:s="http://www.w3.org/2000/svg"><s:path r="1"></s:path></s:svg>');
  });

  it('round-trips every element of a seeded random document through saxes', () => {
    let seed = 7;
    const rnd = (n: number): number => (seed = (seed * 1103515245 + 12345) >>> 0) % n;
    const spaces = [' ', '  ', '\n', '\t', ' \r\n '];
    let text = '<svg xmlns="http://www.w3.org/2000/svg">';
    for (let k = 0; k < 200; k++) {
      const q = rnd(2) ? '"' : "'";
      const sp = (): string => spaces[rnd(spaces.length)];
      text += `<path${sp()}id=${q}p${k}${q}${sp()}d${rnd(2) ? sp() : ''}=${q}M${k} 0${q}${rnd(2) ? sp() : ''}${rnd(2) ? '/>' : '></path>'}`;
    }
    text += '</svg>';
    const els = readSvg(text, OPTS).elements;
    const edits = els.flatMap((e, k) => editStartTag(text, e, k % 2 ? { set: { d: `L${k}`, stroke: '&' } } : { rename: 'polyline' }));
    const out = applyEdits(text, edits);
    const seen: Array<[string, string | undefined, string | undefined]> = [];
    const p = new SaxesParser();
    p.on('opentag', (t) => {
      if (t.name !== 'svg') seen.push([t.name, t.attributes.d as string | undefined, t.attributes.stroke as string | undefined]);
    });
    p.write(out).close();
    expect(seen).toEqual(els.map((e, k) => (k % 2 ? ['path', `L${k}`, '&'] : ['polyline', `M${k} 0`, undefined])));
  });
});
