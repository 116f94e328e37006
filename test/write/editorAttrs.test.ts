/**
 * Editors' parametric descriptions are dropped from rewritten elements, matched
 * by namespace URI, not prefix. The drawing is our own; the attribute names are
 * the editors' open file format (from memory of files they write).
 */
import { describe, expect, it } from 'vitest';
import { SaxesParser, type SaxesTagNS } from 'saxes';
import { INKSCAPE_NS, SODIPODI_NS, parametricAttributes } from '../../src/write/editorAttrs.js';
import { refitSvg } from '../../src/refit.js';

// A quarter-arc wedge drawn by an editor as an "arc" shape (Bézier path data plus its parameters),
// a path with a path effect and its original data, and an element the refit keeps (a circle).
const DOC = `<svg xmlns="http://www.w3.org/2000/svg" xmlns:sp="${SODIPODI_NS}" xmlns:ink="${INKSCAPE_NS}" xmlns:other="urn:example:other"
  width="100mm" height="100mm" viewBox="0 0 100 100">
  <path id="wedge" sp:type="arc" sp:cx="50" sp:cy="50" sp:rx="40" sp:ry="40" sp:start="0" sp:end="1.5707963" sp:open="true" sp:arc-type="arc"
    sp:nodetypes="cc" other:type="keep-me" d="M90 50C90 72.09 72.09 90 50 90"/>
  <path id="fx" ink:path-effect="#effect1" ink:original-d="M10 10L20 20" ink:label="keep label" d="M10 10C20 40 40 40 50 10"/>
  <circle id="hole" sp:nodetypes="c" cx="20" cy="80" r="5"/>
</svg>`;

describe('parametricAttributes', () => {
  it('names editor attributes by namespace URI, whatever the prefix', () => {
    const ns = { '': 'http://www.w3.org/2000/svg', q: SODIPODI_NS, r: INKSCAPE_NS, sodipodi: 'urn:not-the-editor' };
    const attrs = { 'q:type': 'arc', 'q:cx': '1', 'r:original-d': 'M0 0', 'r:label': 'x', 'sodipodi:type': 'arc', cx: '1' };
    expect(parametricAttributes(attrs, ns).sort()).toEqual(['q:cx', 'q:type', 'r:original-d']);
  });
});

describe('refit of elements with a parametric description', () => {
  const r = refitSvg(DOC, { tolerance: 0.05 });
  // The XML parser reads the output back with its own namespace resolution (xmlns mode, which arcspline does not use).
  const tags: SaxesTagNS[] = [];
  const sax = new SaxesParser({ xmlns: true });
  sax.on('opentag', (t) => tags.push(t));
  sax.write(r.text).close();
  const attrsOf = (id: string): { name: string; uri: string; local: string; value: string }[] =>
    Object.values(tags.find((t) => t.attributes.id?.value === id)!.attributes);
  const byId = (id: string): Record<string, string> => Object.fromEntries(attrsOf(id).map((a) => [a.name, a.value]));

  it('drops them from the rewritten elements, so an editor keeps the refit', () => {
    expect(r.report.elements.filter((e) => e.status === 'refitted').map((e) => e.id)).toEqual(['wedge', 'fx']);
    const wedge = byId('wedge');
    expect(attrsOf('wedge').filter((a) => a.uri === SODIPODI_NS).map((a) => a.name)).toEqual([]);
    expect(wedge.d).toMatch(/[aA]/);
    const fx = byId('fx');
    expect(fx['ink:path-effect']).toBeUndefined();
    expect(fx['ink:original-d']).toBeUndefined();
  });

  it('keeps attributes of other namespaces, the editor label, and elements left as written', () => {
    expect(byId('wedge')['other:type']).toBe('keep-me');
    expect(byId('fx')['ink:label']).toBe('keep label');
    expect(r.text).toContain('<circle id="hole" sp:nodetypes="c" cx="20" cy="80" r="5"/>');
  });

  it('says so in one warning', () => {
    const w = r.report.warnings.filter((x) => x.includes('editor attributes'));
    expect(w).toHaveLength(1);
    expect(w[0]).toMatch(/^2 rewritten elements \(first <path id="wedge"> \(element 1\)\) lost the editor attributes/);
    expect(w[0]).toContain('ink:original-d');
  });
});
