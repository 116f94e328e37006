/**
 * XML input safety for untrusted SVG (REFERENCES.md §7).
 *
 * saxes parses the document; it ignores the DOCTYPE's internal subset and
 * resolves `&name;` from a table we give it (`parser.ENTITIES`), inserting the
 * replacement as plain text (never re-parsed as markup). This module builds
 * that table from a small, capped scanner of `<!ENTITY name "value">`
 * declarations, and charges every expansion to one parse-global budget:
 *
 * - refused: SYSTEM/PUBLIC entities (XXE), parameter entities and references,
 *   a second DOCTYPE, recursive entities, markup in replacement text;
 * - tolerated: the standard SVG DOCTYPE with its DTD URL (never fetched:
 *   this module has no file or network access at all);
 * - capped: entity count, nesting depth, size of one replacement, and total
 *   expanded characters ≤ min(8 MiB, 100 × input), counting the five
 *   predefined entities and numeric character references too (the
 *   fast-xml-parser advisories in §7 show why every path must be counted).
 */
import { errorAt, SvgInputError } from './errors.js';

/** Caps; all counts are UTF-16 code units ("characters") of JavaScript strings. */
export interface XmlLimits {
  /** Largest input accepted, characters. */
  maxInputChars: number;
  /** Largest DOCTYPE (with internal subset), characters. */
  maxDoctypeChars: number;
  /** Most entity declarations in the internal subset. */
  maxEntities: number;
  /** Longest replacement text of one entity after nested references are resolved, characters. */
  maxEntityChars: number;
  /** Deepest chain of entities referring to entities (1 = a value may refer to entities that refer to none). */
  maxEntityDepth: number;
  /** Total characters produced by all references (entities and character references), absolute cap. */
  maxExpansionChars: number;
  /** Total characters produced by all references, as a multiple of the input length. */
  maxExpansionRatio: number;
}

/** Default caps (libexpat-style 8 MiB and 100× for the total, §7). */
export const XML_LIMITS: Readonly<XmlLimits> = Object.freeze({
  maxInputChars: 256 * 1024 * 1024,
  maxDoctypeChars: 1024 * 1024,
  maxEntities: 1000,
  maxEntityChars: 1024 * 1024,
  maxEntityDepth: 4,
  maxExpansionChars: 8 * 1024 * 1024,
  maxExpansionRatio: 100,
});

/** The five predefined entities (XML 1.0 §4.6). */
const PREDEFINED: Readonly<Record<string, string>> = Object.freeze({ lt: '<', gt: '>', amp: '&', apos: "'", quot: '"' });

/** What readSvg installs into saxes and calls back into. */
export interface EntityGuard {
  /** Null-prototype entity table for `parser.ENTITIES`; every lookup is charged to the budget. */
  readonly table: Record<string, string>;
  /** Check a DOCTYPE's contents as saxes reports them; `at` = string index of its `<!DOCTYPE`. Throws SvgInputError. */
  doctype(contents: string, at: number): void;
  /** Non-fatal notes (ignored external DTD, ignored ATTLIST, duplicate entity). */
  readonly warnings: string[];
}

type Part = string | { ref: string };

/**
 * Set up the guard for one document. Refuses an oversized input at once and
 * charges numeric character references up front (a conservative count over
 * the whole text, since saxes decodes them internally). `position()` gives the
 * parser's current string index, used to place expansion errors.
 */
export function createEntityGuard(text: string, position: () => number, limits: XmlLimits = XML_LIMITS): EntityGuard {
  if (text.length > limits.maxInputChars) {
    throw new SvgInputError(`input too large: ${text.length} characters, limit ${limits.maxInputChars}`);
  }
  const budget = Math.min(limits.maxExpansionChars, limits.maxExpansionRatio * text.length);
  let spent = 0;
  const charge = (n: number): void => {
    spent += n;
    if (spent > budget) {
      throw errorAt(text, position(), 'unsafe XML', `entity and character references expand to more than ${budget} characters (limit: min(8 MiB, 100 × input))`);
    }
  };
  spent += countCharRefUnits(text);
  if (spent > budget) {
    throw new SvgInputError(`unsafe XML: character references expand to ${spent} characters, more than ${budget} (limit: min(8 MiB, 100 × input))`);
  }

  const table = Object.create(null) as Record<string, string>;
  const install = (name: string, value: string): void => {
    Object.defineProperty(table, name, {
      enumerable: true,
      get(): string {
        charge(value.length);
        return value;
      },
    });
  };
  for (const name of Object.keys(PREDEFINED)) install(name, PREDEFINED[name]);

  const warnings: string[] = [];
  let doctypes = 0;
  return {
    table,
    warnings,
    doctype(contents: string, at: number): void {
      const fail = (what: string): never => {
        throw errorAt(text, at, 'unsafe XML', what);
      };
      doctypes++;
      // XML 1.0 [22] prolog: at most one DOCTYPE; and a second one must not reset anything.
      if (doctypes > 1) fail('a second DOCTYPE declaration');
      if (contents.length > limits.maxDoctypeChars) fail(`DOCTYPE longer than ${limits.maxDoctypeChars} characters`);
      const raw = scanDoctype(contents, fail, warnings);
      if (raw.size > limits.maxEntities) fail(`more than ${limits.maxEntities} entity declarations`);
      const resolved = resolveEntities(raw, limits, fail);
      for (const [name, value] of resolved) install(name, value);
    },
  };
}

/** UTF-16 units produced by every `&#…;` in `text` (counted everywhere, so an over-count is possible, never an under-count). */
function countCharRefUnits(text: string): number {
  let n = 0;
  for (let i = text.indexOf('&#'); i >= 0; i = text.indexOf('&#', i + 2)) {
    const hex = text.charCodeAt(i + 2) === 120; // 'x'
    let j = hex ? i + 3 : i + 2;
    let v = 0;
    for (; j < text.length && j - i < 16; j++) {
      const d = hexDigit(text.charCodeAt(j));
      if (d < 0 || (!hex && d > 9)) break;
      v = v * (hex ? 16 : 10) + d;
    }
    n += v > 0xffff ? 2 : 1;
  }
  return n;
}

function hexDigit(c: number): number {
  if (c >= 48 && c <= 57) return c - 48;
  if (c >= 97 && c <= 102) return c - 87;
  if (c >= 65 && c <= 70) return c - 55;
  return -1;
}

const WS = /[ \t\r\n]/;
const NAME = /^[^\s"'<>&%;=[\]/]+/;

/**
 * The capped DOCTYPE scanner. `s` is what saxes reports: everything between
 * `<!DOCTYPE` and the final `>`. Reads the root name, an optional external ID
 * (tolerated, ignored, never fetched) and the internal subset, returning each
 * general entity's literal value split into text and references. This is not
 * an XML parser: saxes has already checked the DOCTYPE's outer syntax.
 */
function scanDoctype(s: string, fail: (what: string) => never, warnings: string[]): Map<string, Part[]> {
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
function splitValue(v: string, entity: string, fail: (what: string) => never): Part[] {
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
function resolveEntities(raw: Map<string, Part[]>, limits: XmlLimits, fail: (what: string) => never): Map<string, string> {
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
