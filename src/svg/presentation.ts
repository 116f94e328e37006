/**
 * The drawing properties the model reports (stroke, fill, stroke-width) as an
 * element declares them: presentation attributes, overridden by declarations
 * in its `style` attribute (SVG 2 §6.7: presentation attributes come first in
 * the cascade). All three inherit (SVG 2 §13.2, §13.5), so the reader passes
 * the ancestors' values down. Style sheets are not applied.
 */

/** The properties kept. */
export const STYLE_PROPS: readonly string[] = Object.freeze(['stroke', 'fill', 'stroke-width']);

/** The style attribute's `name: value` declarations (last wins), names lower case. */
export function styleDeclarations(style: string | undefined): Map<string, string> {
  const out = new Map<string, string>();
  if (!style) return out;
  for (const part of style.split(';')) {
    const colon = part.indexOf(':');
    if (colon < 0) continue;
    const name = part.slice(0, colon).trim().toLowerCase();
    const value = part.slice(colon + 1).replace(/!important\s*$/i, '').trim();
    if (name && value) out.set(name, value);
  }
  return out;
}

/**
 * The properties an element declares itself, or null when it declares none.
 * `inherit` is left out, so the ancestors' value stands.
 */
export function declaredStyle(attrs: Readonly<Record<string, string>>): Record<string, string> | null {
  const decl = attrs.style !== undefined && /stroke|fill/i.test(attrs.style) ? styleDeclarations(attrs.style) : null;
  let out: Record<string, string> | null = null;
  for (const p of STYLE_PROPS) {
    const v = decl?.get(p) ?? attrs[p]?.trim();
    if (v === undefined || v === '' || v === 'inherit') continue;
    (out ??= {})[p] = v;
  }
  return out;
}
