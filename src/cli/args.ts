/**
 * The command line: flags declared with commander and mapped one to one onto
 * the library's options object (src/options.ts). The CLI adds no defaults of
 * its own: a flag that is not given leaves its option out, so the library's
 * DEFAULT_OPTIONS apply, and `--help` prints those defaults.
 */
import { Command, InvalidArgumentError, Option } from 'commander';
import { readFileSync } from 'node:fs';
import { DEFAULT_OPTIONS, OPTION_DOCS, OptionError, parseToleranceText, resolveOptions, type Options, type OutputFormat } from '../options.js';
import { BUILTIN_PROFILES, loadProfile } from '../machine/profile.js';
import { availableParallelism } from 'node:os';
import { VERSION } from '../version.js';
import { DEFAULT_WORKER_MEMORY_MB } from '../workerPool.js';

/** The flag that sets each library option (every option has exactly one). */
export const OPTION_FLAGS: Readonly<Record<keyof Options, string>> = Object.freeze({
  tolerance: '-t, --tolerance <length>',
  cornerAngle: '--corner-angle <deg>',
  bakeTransforms: '--bake-transforms',
  shapesAsPaths: '--shapes-as-paths',
  keepGrowingCurves: '--keep-growing-curves',
  refitMarked: '--refit-marked',
  assumedMmPerUnit: '--unitless-size <length>',
  digits: '--digits <n>',
  maxInputBytes: '--max-input <MB>',
  format: '--format <name>',
  machineProfile: '--profile <name|file.json>',
  machineOrigin: '--origin <corner>',
  plan: '--plan',
  planJoin: '--no-plan-join',
  planDoubles: '--no-plan-doubles',
  planOrder: '--no-plan-order',
  holesFirst: '--holes-first',
  joinDistance: '--join-distance <length>',
});

/** Commander's attribute name for each option's flag (the camel-cased long flag). */
const ATTRIBUTE: Readonly<Record<keyof Options, string>> = Object.freeze({
  tolerance: 'tolerance',
  cornerAngle: 'cornerAngle',
  bakeTransforms: 'bakeTransforms',
  shapesAsPaths: 'shapesAsPaths',
  keepGrowingCurves: 'keepGrowingCurves',
  refitMarked: 'refitMarked',
  assumedMmPerUnit: 'unitlessSize',
  digits: 'digits',
  maxInputBytes: 'maxInput',
  format: 'format',
  machineProfile: 'profile',
  machineOrigin: 'origin',
  plan: 'plan',
  planJoin: 'planJoin',
  planDoubles: 'planDoubles',
  planOrder: 'planOrder',
  holesFirst: 'holesFirst',
  joinDistance: 'joinDistance',
});

/** Flags of the command itself (not library options), as parsed. */
export interface CliFlags {
  /** `-o` value: a path, `-` for standard output, or undefined. */
  output?: string;
  /** `--report` value: a path, `-` for standard output, or undefined. */
  report?: string;
  inPlace: boolean;
  /** False with `--no-backup`. */
  backup: boolean;
  quiet: boolean;
  debug: boolean;
  /** `--report-lines` value: a path, `-` for standard output, or undefined. */
  reportLines?: string;
  /** `--jobs`: files refitted at once in a batch (≥ 1), or undefined for one per core. */
  jobs?: number;
  /** `--worker-memory`: heap limit per batch worker in MB, or undefined for the default. */
  workerMemoryMb?: number;
  /** `--preview`: a PNG file for the overlay picture of one file, or undefined. */
  preview?: string;
  /** `--table`: print the per-element table on standard error. */
  table: boolean;
}

/** Everything the command line says: inputs, command flags and the library's options. */
export interface ParsedArgs {
  inputs: string[];
  flags: CliFlags;
  /** Only the options the user gave; the library fills in the rest. */
  options: Partial<Options>;
}

/** Where commander writes help, version and its own error messages. */
export interface ProgramOutput {
  writeOut(text: string): void;
  writeErr(text: string): void;
  /** Help text width in columns. */
  width: number;
}

/** A plain decimal number, as flags take it. */
export const DECIMAL = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?\s*$/i;

/** Validate one option with the library's own rules, so the CLI and the library refuse the same values. */
function validated<K extends keyof Options>(key: K, value: Options[K]): Options[K] {
  try {
    resolveOptions({ [key]: value } as Partial<Options>);
  } catch (e) {
    if (e instanceof OptionError) throw new InvalidArgumentError(e.message);
    throw e;
  }
  return value;
}

function parseTolerance(text: string): number {
  try {
    return validated('tolerance', parseToleranceText(text));
  } catch (e) {
    if (e instanceof OptionError) throw new InvalidArgumentError(e.message);
    throw e;
  }
}

function parseUnitlessSize(text: string): number {
  let mm: number;
  try {
    mm = parseToleranceText(text);
  } catch {
    throw new InvalidArgumentError(`"${text}" is not a positive length; use e.g. 1px, 0.5mm or a bare number in mm`);
  }
  return validated('assumedMmPerUnit', mm);
}

function parseNumber(text: string, what: string): number {
  if (!DECIMAL.test(text)) throw new InvalidArgumentError(`"${text}" is not a number of ${what}`);
  return Number(text);
}

function parseCount(text: string, what: string, min: number): number {
  const v = parseNumber(text, what);
  if (!Number.isInteger(v) || v < min) throw new InvalidArgumentError(`"${text}" is not a whole number of ${what} from ${min} up`);
  return v;
}

/** `--max-input <MB>` as bytes (also used by `arcspline measure`). */
export function parseMaxInput(text: string): number {
  return validated('maxInputBytes', Math.round(parseNumber(text, 'MB') * 2 ** 20));
}

/** `--join-distance`: a length as for the tolerance; zero (join only ends that coincide) is allowed. */
function parseJoinDistance(text: string): number {
  const zero = /^\s*(?:0+\.?0*|\.0+)\s*[a-z]*\s*$/i.test(text);
  try {
    return validated('joinDistance', zero ? 0 : parseToleranceText(text)) ?? 0;
  } catch (e) {
    if (e instanceof InvalidArgumentError) throw e;
    throw new InvalidArgumentError(`"${text}" is not a length from 0 up; use e.g. 0.1mm, 0.004in or a bare number in mm`);
  }
}

const PARSERS: Readonly<Partial<Record<keyof Options, (text: string) => unknown>>> = Object.freeze({
  tolerance: parseTolerance,
  cornerAngle: (t: string) => validated('cornerAngle', parseNumber(t, 'degrees')),
  assumedMmPerUnit: parseUnitlessSize,
  digits: (t: string) => validated('digits', parseNumber(t, 'decimal places')),
  maxInputBytes: parseMaxInput,
  format: (t: string) => validated('format', t.toLowerCase() as OutputFormat),
  machineProfile: parseProfileArg,
  machineOrigin: (t: string) => validated('machineOrigin', t.toLowerCase() as Options['machineOrigin']),
  joinDistance: parseJoinDistance,
});

/**
 * `--profile`: a built-in name, or a JSON file read here (the library takes the text) and checked
 * now, so a bad profile is refused before any input is read.
 */
function parseProfileArg(text: string): string {
  if (Object.prototype.hasOwnProperty.call(BUILTIN_PROFILES, text)) return text;
  let json: string;
  try {
    json = readFileSync(text, 'utf8');
  } catch (e) {
    const known = Object.keys(BUILTIN_PROFILES).join(', ');
    throw new InvalidArgumentError(`"${text}" is neither a built-in profile (${known}) nor a readable file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  try {
    loadProfile(json);
  } catch (e) {
    if (e instanceof OptionError) throw new InvalidArgumentError(`${text}: ${e.message}`);
    throw e;
  }
  return json;
}

/**
 * The format an output name asks for: `.gcode`, `.nc`, `.ngc` → gcode, `.dxf` → dxf, `.svg`/`.svgz` → svg;
 * null for any other name (and for none).
 */
export function formatOfOutputName(name: string | undefined): OutputFormat | null {
  if (name === undefined) return null;
  if (/\.(gcode|nc|ngc)$/i.test(name)) return 'gcode';
  if (/\.dxf$/i.test(name)) return 'dxf';
  if (/\.svgz?$/i.test(name)) return 'svg';
  return null;
}

/** A default as `--help` shows it, from DEFAULT_OPTIONS; an empty string when the meaning says it already. */
export function describeDefault(key: keyof Options): string {
  const v = DEFAULT_OPTIONS[key];
  const unit = OPTION_DOCS[key].unit;
  if (v === null) return '';
  if (typeof v === 'boolean') return v ? 'on' : 'off';
  if (key === 'maxInputBytes') return `${(v as number) / 2 ** 20} MB`;
  if (typeof v === 'string') return v;
  return `${+v.toPrecision(7)} ${unit}`;
}

function optionHelp(key: keyof Options): string {
  const doc = OPTION_DOCS[key];
  const def = describeDefault(key);
  let extra = '';
  if (key === 'tolerance') extra = '; mm, cm, in, pt, pc, px or Q, a bare number is mm';
  if (key === 'assumedMmPerUnit') extra = '; a length, a bare number is mm';
  if (key === 'format') extra = '; by default from the -o name: .gcode, .nc, .ngc or .dxf';
  return `${doc.meaning}${extra}${def ? ` (default: ${def})` : ''}`;
}

/** The option of a library setting, declared once for every command that takes it (flag, meaning, default, parser). */
function libraryOption(key: keyof Options): Option {
  const opt = new Option(OPTION_FLAGS[key], optionHelp(key));
  const parse = PARSERS[key];
  if (parse) opt.argParser(parse);
  return opt;
}

/** Which command a parse chose (set by the commands' actions). */
export const CHOSEN = Symbol('arcspline command');

/**
 * The `measure` subcommand: the deviation between any two SVG files. Shares
 * the length and size options with the refit; its own flag is --json.
 */
function measureCommand(): Command {
  const cmd = new Command('measure')
    .description('Measure how far two SVG drawings are apart, in mm on the machine: per element (paired by id, else in document order) and the whole drawing, both directions, with the worst spot.')
    .summary('measure how far two SVG drawings are apart, in mm (arcspline measure --help)')
    .argument('<a>', 'the first SVG file (for example the original), or - for standard input')
    .argument('<b>', 'the second SVG file (for example a refitted one)')
    .addOption(libraryOption('tolerance'))
    .addOption(libraryOption('assumedMmPerUnit'))
    .addOption(libraryOption('maxInputBytes'))
    .option('--json', 'print the figures as JSON instead of a table')
    .addHelpText('after', '\nExit codes: 0 within the tolerance, 1 not within it, 2 usage or input error, 3 internal error.\n')
    .action(function (this: Command) {
      (cmd as unknown as Record<symbol, string>)[CHOSEN] = 'measure';
    });
  return cmd;
}

/** The commander program for one run (commander keeps parsed values on the instance, so build one per run). */
export function buildProgram(out: ProgramOutput, afterHelp: string): Command {
  const program = new Command('arcspline')
    .description('Refit the curves of an SVG cut or plot file with the fewest circular arcs and lines within a tolerance, and report the measured deviation.')
    .argument('<input...>', 'SVG file to refit (.svg, or gzipped .svgz), or - for standard input; or, for a batch, several files, directories (searched for *.svg and *.svgz) and quoted patterns such as "in/**/*.svg"')
    .option('-o, --output <file>', 'write the refitted SVG here (.svgz: gzipped; .gcode, .nc, .ngc: G-code; .dxf: DXF); - is standard output; for a batch, the output directory (see "Output", "Machine files" and "Batches" below)')
    .option('--report <file>', 'write the deviation report as JSON here; - is standard output (one file only)')
    .option('--report-lines <file>', 'write one JSON line per file as it finishes (the report of --report, or an error); - is standard output')
    .option('-j, --jobs <n>', `files refitted at once in a batch, or threads for one very large file (default: one per core, here ${availableParallelism()})`, (t: string) => parseCount(t, 'jobs', 1))
    .option('--worker-memory <MB>', `heap limit of each batch worker (default: ${DEFAULT_WORKER_MEMORY_MB} MB; larger files are refused before reading)`, (t: string) => parseCount(t, 'MB', 64));
  for (const key of Object.keys(OPTION_FLAGS) as (keyof Options)[]) program.addOption(libraryOption(key));
  program
    .option('--table', 'print a table of every element (commands before, pieces after, measured deviation) on standard error; in a batch, one per file')
    .option('--preview <file.png>', 'draw the original (grey) and the result (arcs and lines in colour, knots, worst spots, a mm scale) into a PNG (one file only)')
    .option('--in-place', 'rewrite each input file itself, keeping a backup FILE.bak (an existing FILE.bak is kept: it holds the original from the first rewrite)')
    .option('--no-backup', 'with --in-place, keep no FILE.bak')
    .option('-q, --quiet', 'print no summary line, table or progress bar (warnings and errors still go to standard error)')
    .option('--debug', 'print the stack of an internal error')
    .version(VERSION, '-V, --version', 'print the version')
    .helpOption('-h, --help', 'show this help')
    .configureHelp({ sortOptions: false, helpWidth: out.width })
    .configureOutput({
      writeOut: out.writeOut,
      writeErr: out.writeErr,
      // One line, in the same form as every other arcspline error.
      outputError: (text, write) => write(`arcspline: ${text.replace(/^error: /, '').trimEnd()} (arcspline --help shows the usage)\n`),
      getOutHasColors: () => false,
      getErrHasColors: () => false,
    })
    .exitOverride()
    // Options after `measure` are the subcommand's; no `help` command (a file may be called help).
    .enablePositionalOptions()
    .helpCommand(false);
  // Added after the settings above, so the subcommand inherits the output, help and error handling.
  program.addCommand(measureCommand().copyInheritedSettings(program).configureOutput({
    outputError: (text, write) => write(`arcspline: ${text.replace(/^error: /, '').trimEnd()} (arcspline measure --help shows the usage)\n`),
  }));
  program.addHelpText('after', afterHelp);
  program.action(() => {
    (program as unknown as Record<symbol, string>)[CHOSEN] = 'refit';
  });
  return program;
}

/** The command a parse ran: 'refit' (the program itself) or 'measure'. */
export function chosenCommand(program: Command): 'refit' | 'measure' {
  const measure = program.commands.find((c) => c.name() === 'measure');
  return measure && (measure as unknown as Record<symbol, string>)[CHOSEN] === 'measure' ? 'measure' : 'refit';
}

/** The values of `arcspline measure A B` after a parse. */
export interface MeasureArgs {
  a: string;
  b: string;
  tolerance?: number;
  assumedMmPerUnit?: number;
  maxInputBytes?: number;
  json: boolean;
}

/** Read `measure`'s values back after `parse()`. */
export function parsedMeasure(program: Command): MeasureArgs {
  const cmd = program.commands.find((c) => c.name() === 'measure')!;
  const o = cmd.opts<Record<string, unknown>>();
  return {
    a: cmd.args[0], b: cmd.args[1],
    tolerance: o.tolerance as number | undefined,
    assumedMmPerUnit: o.unitlessSize as number | undefined,
    maxInputBytes: o.maxInput as number | undefined,
    json: o.json === true,
  };
}

/** Read the parsed values back from a program after `parse()`. */
export function parsedArgs(program: Command): ParsedArgs {
  const o = program.opts<Record<string, unknown>>();
  const options: Partial<Options> = {};
  for (const key of Object.keys(ATTRIBUTE) as (keyof Options)[]) {
    const v = o[ATTRIBUTE[key]];
    // A --no-x flag makes commander set x = true by default: only values the user gave count.
    if (v !== undefined && program.getOptionValueSource(ATTRIBUTE[key]) !== 'default') (options as Record<string, unknown>)[key] = v;
  }
  return {
    inputs: program.args.slice(),
    flags: {
      output: o.output as string | undefined,
      report: o.report as string | undefined,
      inPlace: o.inPlace === true,
      backup: o.backup !== false,
      quiet: o.quiet === true,
      debug: o.debug === true,
      reportLines: o.reportLines as string | undefined,
      jobs: o.jobs as number | undefined,
      workerMemoryMb: o.workerMemory as number | undefined,
      preview: o.preview as string | undefined,
      table: o.table === true,
    },
    options,
  };
}
