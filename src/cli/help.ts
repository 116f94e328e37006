/**
 * The text `--help` prints after commander's option list: output rules,
 * tolerance advice, examples, exit codes and the safety caution.
 */
import { DEFAULT_OPTIONS } from '../options.js';
import { EXIT_CODE_DOCS } from './exitCodes.js';

/** The safety caution, printed by `--help` word for word. */
export const SAFETY_CAUTION =
  "arcspline changes geometry. Check the output (for example with the report and a preview) before cutting; follow your machine's manual and local safety rules. Run a G-code program in a simulator or as a dry run with the tool off first.";

/** Wrap a paragraph to `width` columns with a hanging indent. */
function wrap(text: string, width: number, indent = '  '): string {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  let line = indent;
  for (const w of words) {
    if (line.length > indent.length && line.length + 1 + w.length > width) {
      lines.push(line);
      line = indent + w;
    } else {
      line += (line.length > indent.length ? ' ' : '') + w;
    }
  }
  if (line.length > indent.length) lines.push(line);
  return lines.join('\n');
}

/** The help text after the option list, wrapped to `width` columns (at least 40). */
export function afterHelpText(width: number): string {
  const w = Math.max(40, width);
  const p = (t: string): string => wrap(t, w);
  const tol = DEFAULT_OPTIONS.tolerance;
  // Hanging indent: the meaning lines up after the code.
  const codes = EXIT_CODE_DOCS.map(([code, what]) => `  ${code}  ${wrap(what, w, '     ').trimStart()}`).join('\n');
  return [
    '',
    'Output:',
    p('-o FILE writes the refitted SVG to FILE; -o - writes it to standard output. Without -o the SVG goes to standard output when that is not a terminal; on a terminal arcspline refuses and asks for -o.'),
    p('Files are written atomically (a temporary file in the same directory, then renamed), so an error never leaves a partial or new output file. An existing output file is replaced, but never the input: -o naming the input is refused; use --in-place, which keeps the original as FILE.bak unless --no-backup. An existing FILE.bak is kept as it is, so it holds the file from before arcspline first rewrote it (every rewritten element carries its tolerance as data-arcspline-tolerance: a repeated run at the same tolerance keeps it as written, a larger one refits within the difference only; arcspline measure FILE.bak FILE shows the total deviation). An input that needs no change is not rewritten in place.'),
    p('--report FILE writes the report (JSON) with the measured deviation of every element; --report - writes it to standard output, and the SVG must then go to a file with -o.'),
    p('A summary line per file and any warnings go to standard error; --table adds the table of every element (in a batch, one per file).'),
    p('Each file is written back in the encoding it came in (UTF-8, or UTF-16 with its byte order). A .svgz file is read through gzip; the output is gzipped when its name ends in .svgz, plain when it ends in .svg, otherwise like the input.'),
    '',
    'Machine files:',
    p('-o part.gcode (or .nc, .ngc) writes G-code, -o part.dxf writes DXF, from the same fit; --format gcode|dxf chooses for standard output and batches (a batch writes NAME.gcode or NAME.dxf). G-code: G21 G90 G17, G0 travel, G1 lines, G2/G3 arcs with I J, machine Y up with the origin at the page\'s lower-left corner (--origin upper-left for the other), tool lines and feeds from a machine profile (--profile laser, pen-z, pen-servo or a JSON file; schema/profile.schema.json). DXF: LINE and ARC entities in mm, one layer per stroke colour. The written file is read back by an independent reader and every element measured against the original; the header comment states tolerance, measured deviation and the estimated machine time. Every copy a <use> draws is written where it lands, with its own stroke colour; geometry only copies draw (in defs or a symbol) is not written where it stands.'),
    p('With --plan a machine file is planned too: per stroke colour (one layer or operation each, kept apart, in the order the colours first appear) the stroke-only contours are joined, lines drawn twice drawn once and the order chosen for short travel (--holes-first cuts holes before their part); filled shapes keep their place. Each colour is proven as a whole on the file read back; a colour over the tolerance is written unplanned, with a warning. The summary and the estimated time follow the planned order.'),
    '',
    'Batches:',
    p('Several inputs, a directory (searched recursively for *.svg and gzipped *.svgz; other files are counted and ignored) or a quoted pattern ("in/**/*.svg": * within a name, ** across directories, ? one character) make a batch. -o DIR mirrors the input tree under DIR, creating subdirectories; --in-place rewrites each file (with FILE.bak unless --no-backup). An output that would replace an input, or an input inside the output directory, is refused.'),
    p('Files are refitted in parallel in worker threads (--jobs, default one per core), each with a bounded heap (--worker-memory). A file that cannot be read or refitted gives one line naming it and the batch goes on; the exit code is the worst of all files. A progress bar is drawn on a terminal (not when CI is set), and a summary table follows. --report-lines FILE writes one JSON line per file as it finishes: the report --report would write, or {"file", "error": {"exitCode", "message"}}. Ctrl-C stops the batch with exit code 130; files already written are complete and no partial file is left.'),
    '',
    'Tolerance:',
    p(`Lengths take mm, cm, in, pt, pc, px or Q (CSS absolute units, 1in = 25.4mm = 96px); a bare number is mm. The default is ${tol} mm. Common practice for laser work is a tolerance well below the kerf, about 0.1-0.2 mm; use a smaller one for tight-fitting joints. Elements whose measured deviation would exceed the tolerance are kept unchanged.`),
    '',
    'Examples:',
    '  arcspline part.svg -o part.fit.svg --tolerance 0.05mm --report part.report.json',
    '  arcspline - < part.svg > part.fit.svg',
    '  arcspline part.svg -o part.fit.svg --report - > part.report.json',
    '  arcspline --in-place --tolerance 0.002in a.svg b.svg',
    '  arcspline drawings/ -o cleaned/ --tolerance 0.05mm --report-lines cleaned.jsonl',
    '  arcspline "drawings/**/*.svg" -o cleaned/ --jobs 4',
    '  arcspline measure part.svg part.fit.svg --tolerance 0.05mm',
    '  arcspline part.svg -o part.gcode --profile pen-z',
    '  arcspline drawings/ -o cut/ --format dxf',
    '  arcspline part.svg -o part.gcode --plan --holes-first',
    '',
    'Exit codes:',
    codes,
    '',
    'Safety:',
    p(SAFETY_CAUTION),
    '',
  ].join('\n');
}
