/**
 * XML input safety for untrusted SVG (REFERENCES.md §7).
 *
 * saxes parses the document; it ignores the DOCTYPE's internal subset and
 * resolves `&name;` from a table we give it (`parser.ENTITIES`), inserting the
 * replacement as plain text (never re-parsed as markup). This module builds
 * that table from a small, capped scanner of `<!ENTITY name "value">`
 * declarations (src/svg/entities.ts), and charges every expansion to one
 * parse-global budget:
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
import { PREDEFINED, resolveEntities, scanDoctype } from './entities.js';
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


/** What readSvg installs into saxes and calls back into. */
export interface EntityGuard {
  /** Null-prototype entity table for `parser.ENTITIES`; every lookup is charged to the budget. */
  readonly table: Record<string, string>;
  /** Check a DOCTYPE's contents as saxes reports them; `at` = string index of its `<!DOCTYPE`. Throws SvgInputError. */
  doctype(contents: string, at: number): void;
  /** Non-fatal notes (ignored external DTD, ignored ATTLIST, duplicate entity). */
  readonly warnings: string[];
}

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
