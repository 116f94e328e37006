/**
 * Editors' parametric descriptions. A drawing editor may keep, beside the path
 * data, the parameters it regenerates the geometry from: a shape type with its
 * centre, radii and angles, or a path effect with the original path data. Left
 * on a rewritten element, they make the editor rebuild the old geometry at the
 * next edit and the refit is lost; so a rewrite drops them.
 *
 * Matched by namespace URI (the prefix is the file's choice). The attribute
 * names are the editors' open file format (from memory of files they write).
 */

/** The sodipodi namespace, kept by editors descended from it. */
export const SODIPODI_NS = 'http://sodipodi.sourceforge.net/DTD/sodipodi-0.dtd';
/** The inkscape namespace. */
export const INKSCAPE_NS = 'http://www.inkscape.org/namespaces/inkscape';

/** Local names, per namespace, of attributes that regenerate or describe an element's geometry. */
const PARAMETRIC: Readonly<Record<string, ReadonlySet<string>>> = Object.freeze({
  [SODIPODI_NS]: new Set([
    'type', 'cx', 'cy', 'rx', 'ry', 'start', 'end', 'open', 'arc-type', 'nodetypes',
    // stars and polygons, spirals
    'sides', 'r1', 'r2', 'arg1', 'arg2', 'expansion', 'revolution', 'radius', 'argument', 't0',
  ]),
  [INKSCAPE_NS]: new Set(['path-effect', 'original-d', 'flatsided', 'rounded', 'randomized']),
});

/**
 * Qualified names of the attributes to drop from an element that is rewritten.
 * @param attrs attribute values by qualified name
 * @param namespaces prefixes in scope at the element → namespace URI
 */
export function parametricAttributes(attrs: Readonly<Record<string, string>>, namespaces: Readonly<Record<string, string>>): string[] {
  const out: string[] = [];
  for (const name in attrs) {
    const colon = name.indexOf(':');
    // Unprefixed attributes are in no namespace (XML Namespaces §6.2), so never an editor's.
    if (colon < 0) continue;
    const uri = namespaces[name.slice(0, colon)];
    if (uri !== undefined && PARAMETRIC[uri]?.has(name.slice(colon + 1))) out.push(name);
  }
  return out;
}
