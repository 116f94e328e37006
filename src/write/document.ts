/**
 * The splice writer: the output document is the input text with a few byte
 * ranges replaced, so comments, processing instructions, CDATA, entities,
 * DOCTYPE, whitespace, attribute order and quoting all survive untouched.
 *
 * Offsets are JavaScript string indices into the original text, as recorded by
 * readSvg (`startTag`, `endTag` of each GeometryElement).
 */
import type { GeometryElement } from '../svg/document.js';

/** Replace `text.slice(start, end)` with `text`. */
export interface Edit {
  start: number;
  end: number;
  text: string;
}

/** A change to one element's start tag. */
export interface StartTagChange {
  /** New element name; without a prefix it keeps the element's prefix (`svg:circle` → `svg:path`). */
  rename?: string;
  /** Attributes to set (qualified names as written); values are raw strings, escaped here. */
  set?: Record<string, string>;
  /** Attributes to delete, with the whitespace before them. */
  remove?: string[];
}

/**
 * Apply non-overlapping edits given in any order. Throws RangeError on an
 * overlap or an out-of-range edit. Two insertions at the same offset are kept
 * in the order given.
 */
export function applyEdits(text: string, edits: readonly Edit[]): string {
  if (edits.length === 0) return text;
  const order = edits.map((_, k) => k).sort((a, b) => edits[a].start - edits[b].start || edits[a].end - edits[b].end || a - b);
  const pieces: string[] = [];
  let at = 0;
  for (const k of order) {
    const e = edits[k];
    if (!(e.start >= at && e.end >= e.start && e.end <= text.length)) {
      throw new RangeError(`edit [${e.start}, ${e.end}) overlaps another or lies outside the text (length ${text.length})`);
    }
    pieces.push(text.slice(at, e.start), e.text);
    at = e.end;
  }
  pieces.push(text.slice(at));
  return pieces.join('');
}

/** Escape an attribute value for the given quote (XML 1.0 §3.3.3: tabs and line ends as references so normalisation keeps them). */
export function escapeAttr(value: string, quote: '"' | "'" = '"'): string {
  return value.replace(quote === '"' ? /[&<"\t\n\r]/g : /[&<'\t\n\r]/g, (c) => ATTR_ESC[c]);
}

const ATTR_ESC: Readonly<Record<string, string>> = Object.freeze({
  '&': '&amp;',
  '<': '&lt;',
  '"': '&quot;',
  "'": '&apos;',
  '\t': '&#9;',
  '\n': '&#10;',
  '\r': '&#13;',
});

/** One attribute as written in a start tag: string indices of its leading whitespace, name, value (inside the quotes). */
interface AttrSpan {
  name: string;
  wsStart: number;
  valueStart: number;
  valueEnd: number;
  quote: '"' | "'";
}

function isWs(c: number): boolean {
  return c === 32 || c === 9 || c === 10 || c === 13;
}

/**
 * Locate the name and attributes in a start tag saxes has already checked for
 * well-formedness: names run to whitespace, `=`, `/` or `>`; values are quoted
 * and contain no `<` (XML 1.0 [10] AttValue) and no unescaped own quote.
 */
function scanStartTag(text: string, start: number, end: number): { nameEnd: number; attrs: AttrSpan[]; lastEnd: number } {
  if (text.charCodeAt(start) !== 60) throw new RangeError(`no start tag at offset ${start}`);
  let i = start + 1;
  while (i < end && !isWs(text.charCodeAt(i)) && text[i] !== '>' && text[i] !== '/') i++;
  const nameEnd = i;
  let lastEnd = nameEnd;
  const attrs: AttrSpan[] = [];
  for (;;) {
    const wsStart = i;
    while (i < end && isWs(text.charCodeAt(i))) i++;
    if (i >= end || text[i] === '>' || text[i] === '/') break;
    const nameStart = i;
    while (i < end && !isWs(text.charCodeAt(i)) && text[i] !== '=') i++;
    const name = text.slice(nameStart, i);
    while (i < end && text[i] !== '"' && text[i] !== "'") i++;
    const quote = text[i] as '"' | "'";
    const valueStart = i + 1;
    const valueEnd = text.indexOf(quote, valueStart);
    if (valueEnd < 0 || valueEnd >= end) throw new RangeError(`malformed start tag at offset ${start}`);
    attrs.push({ name, wsStart, valueStart, valueEnd, quote });
    i = valueEnd + 1;
    lastEnd = i;
  }
  return { nameEnd, attrs, lastEnd };
}

/**
 * Edits that apply `change` to `el`'s start tag (and its end tag for a
 * rename). Only changed values are rewritten, inside their original quotes;
 * everything else in the tag stays byte-identical. A new attribute is written
 * ` name="value"` right after the last attribute, so whitespace before `>` or
 * `/>` is kept. Setting an attribute to its current raw text yields no edit.
 */
export function editStartTag(text: string, el: Pick<GeometryElement, 'startTag' | 'endTag'>, change: StartTagChange): Edit[] {
  const [start, end] = el.startTag;
  const tag = scanStartTag(text, start, end);
  const edits: Edit[] = [];
  const remove = new Set(change.remove ?? []);
  const set = change.set ?? {};
  for (const name of Object.keys(set)) {
    if (remove.has(name)) throw new Error(`attribute "${name}" is both set and removed`);
  }
  if (change.rename !== undefined) {
    const old = text.slice(start + 1, tag.nameEnd);
    const colon = old.indexOf(':');
    const name = change.rename.includes(':') || colon < 0 ? change.rename : old.slice(0, colon + 1) + change.rename;
    if (name !== old) {
      edits.push({ start: start + 1, end: tag.nameEnd, text: name });
      if (el.endTag) {
        // "</" + old name; saxes has checked the end tag matches.
        edits.push({ start: el.endTag[0] + 2, end: el.endTag[0] + 2 + old.length, text: name });
      }
    }
  }
  const seen = new Set<string>();
  for (const a of tag.attrs) {
    seen.add(a.name);
    if (remove.has(a.name)) {
      edits.push({ start: a.wsStart, end: a.valueEnd + 1, text: '' });
    } else if (Object.prototype.hasOwnProperty.call(set, a.name)) {
      const v = escapeAttr(set[a.name], a.quote);
      if (v !== text.slice(a.valueStart, a.valueEnd)) edits.push({ start: a.valueStart, end: a.valueEnd, text: v });
    }
  }
  let added = '';
  for (const name of Object.keys(set)) {
    if (!seen.has(name)) added += ` ${name}="${escapeAttr(set[name])}"`;
  }
  if (added) edits.push({ start: tag.lastEnd, end: tag.lastEnd, text: added });
  return edits;
}
