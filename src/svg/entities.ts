/**
 * The DOCTYPE internal subset, read just far enough to collect internal
 * general entities (REFERENCES.md §7): a small, capped scanner, not an XML
 * parser (saxes parses the document and has checked the DOCTYPE's outer
 * syntax). Refusals go through `fail`, which throws; caps come from
 * {@link XmlLimits}. Used only by src/svg/xmlSafety.ts.
 */
import type { XmlLimits } from './xmlSafety.js';

/** The five predefined entities (XML 1.0 §4.6). */
export const PREDEFINED: Readonly<Record<string, string>> = Object.freeze({ lt: '<', gt: '>', amp: '&', apos: "'", quot: '"' });

/** A literal entity value split into plain text and references to other entities. */
export type Part = string | { ref: string };

/** Throws; the message names the problem. */
export type Fail = (what: string) => never;

const WS = /[ \t\r\n]/;
const NAME = /^[^\s"'<>&%;=[\]/]+/;

/**
 * The capped DOCTYPE scanner. `s` is what saxes reports: everything between
 * `<!DOCTYPE` and the final `>`. Reads the root name, an optional external ID
 * (tolerated, ignored, never fetched) and the internal subset, returning each
 * general entity's literal value split into text and references. This is not
 * an XML parser: saxes has already checked the DOCTYPE's outer syntax.
 */
export function scanDoctype(s: string, fail: Fail, warnings: string[]): Map<string, Part[]> {
  const entities = new Map<string, Part[]>();
  let i = 0;
  const skipWs = (): void => {
    while (i < s.length && WS.test(s[i])) i++;
  };
  const name = (): string => {
    const m = NAME.exec(s.slice(i, i + 256));
    if (!m) fail(`expected a name in DOCTYPE near "${s.slice(i, i + 20)}"`);
    i += m![0].length;
    return m![0];
  };
  const quoted = (): string => {
    const q = s[i];
    if (q !== '"' && q !== "'") fail(`expected a quoted string in DOCTYPE near "${s.slice(i, i + 20)}"`);
    const end = s.indexOf(q, i + 1);
    if (end < 0) fail('unterminated string in DOCTYPE');
    const v = s.slice(i + 1, end);
    i = end + 1;
    return v;
  };
  const skipPast = (close: string): void => {
    const end = s.indexOf(close, i);
    if (end < 0) fail(`unterminated ${close} in DOCTYPE`);
    i = end + close.length;
  };
  const skipDecl = (): void => {
    // Up to the '>' that is not inside a quoted literal.
    while (i < s.length && s[i] !== '>') {
      if (s[i] === '"' || s[i] === "'") quoted();
      else i++;
    }
    i++;
  };

  skipWs();
  name();
  skipWs();
  if (s.startsWith('SYSTEM', i) || s.startsWith('PUBLIC', i)) {
    const pub = s.startsWith('PUBLIC', i);
    i += 6;
    skipWs();
    if (pub) {
      quoted();
      skipWs();
    }
    const url = quoted();
    // XML §5.1: a non-validating processor need not read the external subset; we never do.
    if (!/^https?:\/\/www\.w3\.org\/Graphics\/SVG\//.test(url)) {
      warnings.push(`external DTD "${url}" ignored (never fetched)`);
    }
    skipWs();
  }
  if (s[i] === '[') {
    i++;
    for (;;) {
      skipWs();
      if (i >= s.length) fail('unterminated internal subset in DOCTYPE');
      if (s[i] === ']') {
        i++;
        break;
      }
      if (s.startsWith('<!--', i)) skipPast('-->');
      else if (s.startsWith('<?', i)) skipPast('?>');
      else if (s.startsWith('<!ENTITY', i)) {
        i += 8;
        skipWs();
        if (s[i] === '%') fail('parameter entity declaration is not allowed');
        const n = name();
        skipWs();
        if (s.startsWith('SYSTEM', i) || s.startsWith('PUBLIC', i)) {
          fail(`external entity "${n}" (${s.slice(i, i + 6)}) is not allowed; nothing is fetched`);
        }
        const value = quoted();
        skipWs();
        if (s[i] !== '>') fail(`unexpected content in entity "${n}" declaration`);
        i++;
        if (n in PREDEFINED) continue; // XML §4.6: may be redeclared; the built-in meaning stays.
        if (entities.has(n)) {
          // XML §4.2: the first declaration is binding.
          warnings.push(`entity "${n}" declared twice; the first declaration is used`);
          continue;
        }
        entities.set(n, splitValue(value, n, fail));
      } else if (s.startsWith('<!ATTLIST', i)) {
        warnings.push('ATTLIST declarations in the DOCTYPE are ignored (attribute defaults from a DTD are not applied)');
        skipDecl();
      } else if (s.startsWith('<!ELEMENT', i) || s.startsWith('<!NOTATION', i)) skipDecl();
      else if (s[i] === '%') fail('parameter entity reference in DOCTYPE is not allowed');
      else fail(`unexpected content in DOCTYPE near "${s.slice(i, i + 20)}"`);
    }
    skipWs();
  }
  if (i < s.length) fail(`unexpected content in DOCTYPE near "${s.slice(i, i + 20)}"`);
  return entities;
}

/**
 * Split a literal entity value into text and entity references. Character
 * references are decoded here (XML §4.5); one that yields `<` or `&`, or a
 * literal `<`, would make the replacement markup, which we refuse.
 */
function splitValue(v: string, entity: string, fail: Fail): Part[] {
  const parts: Part[] = [];
  let text = '';
  let i = 0;
  while (i < v.length) {
    const c = v[i];
    if (c === '<') fail(`entity "${entity}" contains markup; only plain-text entities are allowed`);
    if (c === '%') fail(`parameter entity reference in entity "${entity}" is not allowed`);
    if (c !== '&') {
      text += c;
      i++;
      continue;
    }
    const semi = v.indexOf(';', i);
    if (semi < 0) fail(`unterminated reference in entity "${entity}"`);
    const ref = v.slice(i + 1, semi);
    i = semi + 1;
    if (ref[0] === '#') {
      const code = ref[1] === 'x' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
      if (!/^#(x[0-9a-fA-F]+|[0-9]+)$/.test(ref) || !(code > 0 && code <= 0x10ffff)) fail(`bad character reference &${ref}; in entity "${entity}"`);
      if (code === 60 || code === 38) fail(`entity "${entity}" contains markup; only plain-text entities are allowed`);
      text += String.fromCodePoint(code);
    } else if (ref in PREDEFINED) {
      text += PREDEFINED[ref];
    } else {
      if (!NAME.test(ref)) fail(`bad reference &${ref}; in entity "${entity}"`);
      if (text) parts.push(text);
      text = '';
      parts.push({ ref });
    }
  }
  if (text) parts.push(text);
  return parts;
}

/**
 * Resolve nested references with an explicit stack (no recursion), refusing
 * cycles (XML §4.1 WFC No Recursion), chains deeper than the cap, undeclared
 * references and replacements over the size cap. Lengths are checked before
 * any string is built, so a billion-laughs table is refused in microseconds.
 */
export function resolveEntities(raw: Map<string, Part[]>, limits: XmlLimits, fail: Fail): Map<string, string> {
  const length = new Map<string, number>();
  const depth = new Map<string, number>();
  const onPath = new Set<string>();
  let total = 0;
  for (const root of raw.keys()) {
    if (length.has(root)) continue;
    const stack: string[] = [root];
    onPath.add(root);
    while (stack.length > 0) {
      const name = stack[stack.length - 1];
      let pending: string | null = null;
      let len = 0;
      let d = 0;
      for (const p of raw.get(name)!) {
        if (typeof p === 'string') {
          len += p.length;
          continue;
        }
        if (!raw.has(p.ref)) fail(`entity "${name}" refers to undeclared entity "${p.ref}"`);
        if (onPath.has(p.ref)) fail(`recursive entity "${p.ref}" (${[...stack.slice(stack.indexOf(p.ref)), p.ref].join(' → ')})`);
        const l = length.get(p.ref);
        if (l === undefined) {
          pending = p.ref;
          break;
        }
        len += l;
        d = Math.max(d, depth.get(p.ref)! + 1);
      }
      if (pending !== null) {
        stack.push(pending);
        onPath.add(pending);
        continue;
      }
      if (d > limits.maxEntityDepth) fail(`entity "${name}" nests references ${d} deep (limit ${limits.maxEntityDepth})`);
      if (len > limits.maxEntityChars) fail(`entity "${name}" expands to ${len} characters (limit ${limits.maxEntityChars})`);
      total += len;
      if (total > limits.maxExpansionChars) fail(`entity declarations expand to more than ${limits.maxExpansionChars} characters`);
      length.set(name, len);
      depth.set(name, d);
      onPath.delete(name);
      stack.pop();
    }
  }
  // Every length is bounded now; build the strings, references first (lengths are memoised in order).
  const out = new Map<string, string>();
  const build = (name: string): string => {
    let s = '';
    for (const p of raw.get(name)!) s += typeof p === 'string' ? p : out.get(p.ref)!;
    return s;
  };
  const order = [...length.keys()].sort((a, b) => depth.get(a)! - depth.get(b)!);
  for (const name of order) out.set(name, build(name));
  return out;
}
