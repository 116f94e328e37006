/**
 * The one options module: every option, its meaning, unit and default, in one
 * frozen table. The CLI maps flags onto this object and adds no defaults of its
 * own; the library takes the same object.
 */

export interface Options {
  /** Largest allowed distance between the original and the refitted geometry, in mm on the machine. */
  tolerance: number;
  /** A vertex where the outline turns by more than this many degrees stays a sharp corner. */
  cornerAngle: number;
  /** Write circular arcs in root coordinates with element transforms removed (for arc-capable controllers). */
  bakeTransforms: boolean;
  /** Also rewrite circle, ellipse and rect elements, which are exact already, as paths. */
  shapesAsPaths: boolean;
  /** Keep as written an element with Bézier curves whose refit has more pieces or more bytes than it has. */
  keepGrowingCurves: boolean;
  /** Refit elements a previous run marked (data-arcspline-tolerance) as if new; their deviations may then add up. */
  refitMarked: boolean;
  /** Millimetres per user unit for a file that states no physical size (CSS px: 25.4/96). */
  assumedMmPerUnit: number;
  /** Decimal places for written coordinates; null derives them from the tolerance. */
  digits: number | null;
  /** Largest input accepted, in bytes (characters for a string); larger inputs are refused before parsing. */
  maxInputBytes: number;
  /** What to write: the SVG with arcs, or a machine file (G-code, DXF) from the same fit. */
  format: OutputFormat;
  /** Machine output: a built-in profile name (laser, pen-z, pen-servo) or a profile's JSON text. */
  machineProfile: string;
  /** Machine output: the page corner at the machine origin (Y always points up). */
  machineOrigin: 'lower-left' | 'upper-left';
  /** Plan the path of stroke-only geometry, per stroke colour: join, draw double lines once, reorder (src/plan). */
  plan: boolean;
  /** With `plan`: join open contours whose ends meet. */
  planJoin: boolean;
  /** With `plan`: draw lines drawn twice (exactly, reversed or in part) once. */
  planDoubles: boolean;
  /** With `plan`: reorder, reverse open contours and move closed contours' start to shorten travel. */
  planOrder: boolean;
  /** With `plan`: draw every contour inside a closed contour before that contour (holes before the part). */
  holesFirst: boolean;
  /** With `plan`: ends closer than this are joined, mm; null: the tolerance. */
  joinDistance: number | null;
}

/** Output formats. */
export type OutputFormat = 'svg' | 'gcode' | 'dxf';
/** Every output format, for validation and help. */
export const OUTPUT_FORMATS: readonly OutputFormat[] = Object.freeze(['svg', 'gcode', 'dxf']);

/**
 * Options as a caller gives them: every field optional (defaults in
 * DEFAULT_OPTIONS), `tolerance` also as a length with a unit ("0.05mm",
 * "0.002in", "0.2px"; a bare number or numeric string is mm). An unknown key
 * is refused with the closest known option named.
 */
export type ArcsplineOptions = Partial<Omit<Options, 'tolerance'>> & { tolerance?: number | string };

export interface OptionDoc {
  meaning: string;
  unit: string;
}

export const DEFAULT_OPTIONS: Readonly<Options> = Object.freeze({
  tolerance: 0.1,
  cornerAngle: 30,
  bakeTransforms: false,
  shapesAsPaths: false,
  keepGrowingCurves: false,
  refitMarked: false,
  assumedMmPerUnit: 25.4 / 96,
  digits: null,
  maxInputBytes: 256 * 2 ** 20,
  format: 'svg',
  machineProfile: 'laser',
  machineOrigin: 'lower-left',
  plan: false,
  planJoin: true,
  planDoubles: true,
  planOrder: true,
  holesFirst: false,
  joinDistance: null,
});

export const OPTION_DOCS: Readonly<Record<keyof Options, OptionDoc>> = Object.freeze({
  tolerance: { meaning: 'largest allowed deviation from the original geometry', unit: 'mm' },
  cornerAngle: { meaning: 'turns sharper than this stay sharp corners', unit: 'degrees' },
  bakeTransforms: { meaning: 'write circular arcs in root coordinates, element transforms removed', unit: 'flag' },
  shapesAsPaths: { meaning: 'rewrite exact circle/ellipse/rect elements as paths too', unit: 'flag' },
  keepGrowingCurves: { meaning: 'keep an element with Bézier curves as written when its refit has more pieces or bytes', unit: 'flag' },
  refitMarked: { meaning: 'refit elements an earlier run marked (data-arcspline-tolerance) as if new; deviations from the first original may then add up', unit: 'flag' },
  assumedMmPerUnit: { meaning: 'size of one user unit when the file states no physical size', unit: 'mm' },
  digits: { meaning: 'decimal places written (default: derived from the tolerance)', unit: 'count' },
  maxInputBytes: { meaning: 'largest input accepted; larger files are refused before reading (memory: plan for about 20x the file size)', unit: 'bytes' },
  format: { meaning: 'output: svg, gcode or dxf (the same fit; a machine file is read back and measured)', unit: 'name' },
  machineProfile: { meaning: 'machine profile for G-code: laser, pen-z, pen-servo or a JSON profile', unit: 'name' },
  machineOrigin: { meaning: 'page corner at the machine origin in G-code and DXF: lower-left or upper-left', unit: 'name' },
  plan: { meaning: 'plan the path of stroke-only geometry (no fill, or none that paints: a line) per stroke colour: join ends that meet, draw double lines once, reorder for short travel; filled shapes are left alone (SVG and machine output)', unit: 'flag' },
  planJoin: { meaning: 'with the plan: join open contours whose ends meet', unit: 'flag' },
  planDoubles: { meaning: 'with the plan: draw lines drawn twice (exactly, reversed, in part) once', unit: 'flag' },
  planOrder: { meaning: 'with the plan: reorder and reverse contours and move closed contours\' start points for short travel', unit: 'flag' },
  holesFirst: { meaning: 'with the plan: cut every contour inside a closed contour before that contour (holes before the part)', unit: 'flag' },
  joinDistance: { meaning: 'with the plan: ends closer than this are joined (default: the tolerance)', unit: 'mm' },
});

/**
 * Smallest tolerance accepted, mm: 0.1 µm, finer than any cutter or plotter moves, and the sampling of
 * the measurement stays within its memory limits above it (a 100 mm line at 0.1 µm is a few million samples).
 */
export const MIN_TOLERANCE_MM = 1e-4;

/** Refuse a tolerance below {@link MIN_TOLERANCE_MM} with a message naming it. */
export function checkTolerance(tolMm: number): void {
  if (tolMm < MIN_TOLERANCE_MM) {
    throw new OptionError(`tolerance ${+tolMm.toPrecision(6)} mm is below ${MIN_TOLERANCE_MM} mm (0.1 µm), finer than any machine moves; use ${MIN_TOLERANCE_MM}mm or more`);
  }
}

/** Error for an option value a user gave; its message names the option and the bad value. */
export class OptionError extends Error {
  override name = 'OptionError';
}

/** Edits needed to turn `a` into `b` (insert, delete, substitute one character). */
function editDistance(a: string, b: string): number {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let diag = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const up = row[j];
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1));
      diag = up;
    }
  }
  return row[b.length];
}

/** The known option closest to a misspelt key (case ignored), or null when none is near. */
export function closestOption(key: string): keyof Options | null {
  let best: keyof Options | null = null, bestD = Infinity;
  for (const k of Object.keys(DEFAULT_OPTIONS) as (keyof Options)[]) {
    const d = editDistance(key.toLowerCase(), k.toLowerCase());
    if (d < bestD) {
      bestD = d;
      best = k;
    }
  }
  return bestD <= Math.max(2, Math.floor(key.length / 3)) ? best : null;
}

/**
 * Fill in defaults (with ??, so 0 and false pass) and validate.
 * @throws OptionError for a bad value or an unknown key (naming the closest known option)
 */
export function resolveOptions(input: ArcsplineOptions = {}): Options {
  if (input === null || typeof input !== 'object') throw new OptionError(`options must be an object, got ${String(input)}`);
  for (const key of Object.keys(input)) {
    if (Object.prototype.hasOwnProperty.call(DEFAULT_OPTIONS, key)) continue;
    const near = closestOption(key);
    throw new OptionError(`unknown option "${key}"${near ? `; did you mean "${near}"?` : `; known options: ${Object.keys(DEFAULT_OPTIONS).join(', ')}`}`);
  }
  const partial = input as Partial<Options>;
  const tolerance = typeof input.tolerance === 'string' ? parseToleranceText(input.tolerance) : input.tolerance;
  // Every option its default unless given (undefined means not given; null is a value where an option takes it).
  const o: Options = { ...DEFAULT_OPTIONS };
  for (const k of Object.keys(DEFAULT_OPTIONS) as (keyof Options)[]) {
    const v = k === 'tolerance' ? tolerance : partial[k];
    if (v === undefined) continue;
    if (typeof DEFAULT_OPTIONS[k] === 'boolean' && typeof v !== 'boolean') throw new OptionError(`${k} must be true or false, got ${String(v)}`);
    (o as unknown as Record<string, unknown>)[k] = v;
  }

  if (!(o.tolerance > 0) || !Number.isFinite(o.tolerance)) {
    throw new OptionError(`tolerance must be a positive number of mm, got ${String(partial.tolerance)}`);
  }
  checkTolerance(o.tolerance);
  if (!(o.cornerAngle >= 0 && o.cornerAngle <= 180)) {
    throw new OptionError(`cornerAngle must be between 0 and 180 degrees, got ${String(partial.cornerAngle)}`);
  }
  if (!(o.assumedMmPerUnit > 0) || !Number.isFinite(o.assumedMmPerUnit)) {
    throw new OptionError(`assumedMmPerUnit must be a positive number, got ${String(partial.assumedMmPerUnit)}`);
  }
  if (o.digits !== null && !(Number.isInteger(o.digits) && o.digits >= 0 && o.digits <= 12)) {
    throw new OptionError(`digits must be a whole number from 0 to 12, got ${String(partial.digits)}`);
  }
  if (!(o.maxInputBytes > 0) || !Number.isFinite(o.maxInputBytes)) {
    throw new OptionError(`maxInputBytes must be a positive number of bytes, got ${String(partial.maxInputBytes)}`);
  }
  if (!OUTPUT_FORMATS.includes(o.format)) throw new OptionError(`format must be one of ${OUTPUT_FORMATS.join(', ')}, got ${String(partial.format)}`);
  if (typeof o.machineProfile !== 'string' || o.machineProfile.length === 0) {
    throw new OptionError(`machineProfile must be a profile name or a profile's JSON text, got ${String(partial.machineProfile)}`);
  }
  if (o.machineOrigin !== 'lower-left' && o.machineOrigin !== 'upper-left') {
    throw new OptionError(`machineOrigin must be lower-left or upper-left, got ${String(partial.machineOrigin)}`);
  }
  if (o.joinDistance !== null && !(o.joinDistance >= 0 && Number.isFinite(o.joinDistance))) {
    throw new OptionError(`joinDistance must be a number of mm from 0 up (or null for the tolerance), got ${String(partial.joinDistance)}`);
  }
  if (o.plan && o.bakeTransforms) throw new OptionError('plan and bakeTransforms cannot be used together yet: the plan writes each colour\'s contours in the coordinates of its first element');
  return o;
}

const LENGTH_TO_MM: Readonly<Record<string, number>> = Object.freeze({
  // CSS Values 3 §5.2 absolute lengths: 1in = 2.54cm = 96px.
  mm: 1,
  cm: 10,
  in: 25.4,
  pt: 25.4 / 72,
  pc: 25.4 / 6,
  px: 25.4 / 96,
  q: 0.25,
});

/** Parse a tolerance such as "0.05mm", "0.002in", "0.5px" or a bare number (mm). */
export function parseToleranceText(text: string): number {
  const m = /^\s*([+]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)\s*([a-z]*)\s*$/i.exec(text);
  const unit = m ? (m[2] || 'mm').toLowerCase() : '';
  const k = LENGTH_TO_MM[unit];
  if (!m || k === undefined) {
    throw new OptionError(`tolerance "${text}" is not a length; use e.g. 0.05mm, 0.002in, 0.2px or a bare number in mm`);
  }
  const v = Number(m[1]) * k;
  if (!(v > 0) || !Number.isFinite(v)) throw new OptionError(`tolerance must be positive, got "${text}"`);
  return v;
}
