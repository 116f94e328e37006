/**
 * The one error type for input that is not a readable SVG document: malformed
 * XML, a root that is not `<svg>`, or XML the safety rules refuse. Its message
 * is one line, fit to print without a stack.
 */

/** Input that cannot be read as an SVG document; `line` and `column` are 1-based (0 when unknown). */
export class SvgInputError extends Error {
  override name = 'SvgInputError';
  /** 1-based line of the problem, counting CR LF, CR and LF each as one line break; 0 when unknown. */
  readonly line: number;
  /** 1-based column of the problem in Unicode characters (code points); 0 when unknown. */
  readonly column: number;

  constructor(message: string, line = 0, column = 0) {
    super(message);
    this.line = line;
    this.column = column;
  }
}

/**
 * Line and column (both 1-based) of a string index into `text`. Columns count
 * code points, so an astral character is one column, as in most editors.
 * Cost is linear in `offset`; meant for error paths only.
 */
export function lineColumnAt(text: string, offset: number): { line: number; column: number } {
  const end = Math.max(0, Math.min(offset, text.length));
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) {
      line++;
      lineStart = i + 1;
    } else if (c === 13) {
      // XML 1.0 §2.11: CR LF and a lone CR are each one line end.
      if (text.charCodeAt(i + 1) === 10) i++;
      line++;
      lineStart = i + 1;
    }
  }
  let column = 1;
  for (let i = lineStart; i < end; i++) {
    const c = text.charCodeAt(i);
    // A high surrogate followed by a low one is one character.
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < end) {
      const d = text.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) i++;
    }
    column++;
  }
  return { line, column };
}

/** An SvgInputError whose message starts with `<kind> at L:C: ` for the given string index. */
export function errorAt(text: string, offset: number, kind: string, what: string): SvgInputError {
  const { line, column } = lineColumnAt(text, offset);
  return new SvgInputError(`${kind} at ${line}:${column}: ${what}`, line, column);
}
