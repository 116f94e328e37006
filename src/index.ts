/**
 * arcspline as a library (`import { refitSvg } from 'arcspline'`): the same
 * pure functions the command runs, with the same options object.
 *
 * ```js
 * import { readFile, writeFile } from 'node:fs/promises';
 * import { refitSvg, parseToleranceText } from 'arcspline';
 *
 * const text = await readFile('part.svg', 'utf8');
 * const { text: out, report } = refitSvg(text, { tolerance: '0.05mm' }, 'part.svg');
 * if (!report.totals.withinTolerance) console.warn('some elements kept unchanged');
 * await writeFile('part.fit.svg', out);
 * ```
 *
 * Every length is in millimetres on the machine unless a name says otherwise.
 * Nothing here reads or writes files; the functions are synchronous and
 * independent per call, so a script may run them in its own worker threads.
 */

/**
 * Refit every curve of an SVG document with circular arcs and lines within
 * `options.tolerance` (mm), and measure the result.
 * `refitSvg(text: string, options?: ArcsplineOptions, file?: string | null): RefitResult`;
 * throws SvgInputError for text that is not a readable SVG document and
 * OptionError for a bad option value or an unknown option (naming the closest one).
 */
export { refitSvg } from './refit.js';
export type { RefitResult, StageTimes } from './refit.js';
/** The same job on several threads (worker threads; same text and report). */
export { refitSvgParallel } from './refitParallel.js';

/**
 * The options object shared by the CLI and the library: `DEFAULT_OPTIONS`
 * (frozen defaults), `OPTION_DOCS` (meaning and unit of each),
 * `resolveOptions(partial)` (fills defaults with `??`, validates, throws
 * OptionError), and `parseToleranceText("0.05mm" | "0.002in" | "0.2px" | "0.1")`
 * returning mm.
 */
export { DEFAULT_OPTIONS, OPTION_DOCS, OptionError, parseToleranceText, resolveOptions } from './options.js';
export type { OptionDoc, Options, OutputFormat } from './options.js';

/**
 * Machine output: `refitToMachine(text, { format: 'gcode' | 'dxf', machineProfile, machineOrigin, … }, file?)`
 * gives the G-code or DXF text and the report (its `machine` field: lines, moves, estimated time), every
 * element measured on the file read back by an independent reader. Below it, for a drawing of your own:
 * `writeMachineFile(drawing, opts)` (write, read back, prove, estimate time), the profiles
 * (`BUILTIN_PROFILES`, `loadProfile(nameOrJson)`, `parseProfile(object)`, schema/profile.schema.json),
 * the writers as sinks (`GcodeWriter`, `DxfWriter`) and the motion model (`estimateTime`).
 */
export { refitToMachine } from './refitMachine.js';
export type { MachineRefitResult } from './refitMachine.js';
export { straightEstimate, writeMachineFile } from './machine/program.js';
export type { MachineFile, MachineFileOptions, MachineFormat } from './machine/program.js';
export type { MachineContour, MachineDrawing, MachineElement, MachineOrigin } from './machine/drawing.js';
export { BUILTIN_PROFILES, ProfileError, loadProfile, parseProfile } from './machine/profile.js';
export type { ColourSettings, MachineProfile } from './machine/profile.js';
export { GcodeWriter } from './write/gcode.js';
export { DxfWriter } from './write/dxf.js';
export type { MachineSink, MachineMove } from './machine/sink.js';
export { estimateTime } from './machine/motion.js';
export type { MotionEstimate, MotionParams } from './machine/motion.js';

/**
 * The fitter on its own: `fitPolyline(xy: Float64Array, opts: FitOptions): FitResult`
 * fits a flat x,y polyline (mm) with the fewest tangent-continuous arcs and
 * lines within `opts.tolerance`; `arcGeometry(segment)` reads an arc's centre,
 * radius and signed sweep (radians) off its motor.
 */
export { fitPolyline } from './fit/fitPolyline.js';
export type { FitOptions, FitResult } from './fit/fitPolyline.js';
/**
 * One contour never worse than its input: `fitContour(xy, opts)` returns the cheapest of the spline,
 * straight moves through its vertices and (given `opts.originalPieces`) its own source pieces, each within
 * the tolerance by the independent measurement, and says which it chose.
 */
export { fitContour } from './fit/fitContour.js';
export type { ContourChoice, ContourFit, ContourOptions } from './fit/fitContour.js';
export { arcGeometry } from './fit/segment.js';
export type { ArcGeometry, Segment } from './fit/segment.js';

/** The report's shape (also schema/report.schema.json); distances in mm. */
export type { Deviation, ElementReport, FileReport, MachineSummary, OutcomeReason, OutcomeStatus } from './report/types.js';
/** Verdicts read off the statuses: `isOverTolerance(element)`, `withinTolerance(elements)`. */
export { isOverTolerance, withinTolerance } from './report/status.js';

/**
 * The independent deviation measurement:
 * `measureDeviation(original, originalToMm, written, writtenToMm, toleranceMm, maxSamples?): Deviation | null`
 * over parsed path data and 6-number SVG matrices (user units → mm).
 */
export { DEFAULT_MAX_SAMPLES, measureDeviation } from './measure/measure.js';
export { polylineDeviation, polylinePath, segmentsToPathData } from './measure/polylineDeviation.js';
export { formatTable } from './report/table.js';
// The preview picture is its own entry, 'arcspline/preview' (src/preview.ts): it needs sharp's native code.

/**
 * Measure any two SVG documents against each other:
 * `compareSvg(a: string, b: string, opts: CompareOptions): Comparison`.
 */
export { compareSvg } from './measure/compare.js';
export type { CompareOptions, Comparison, ElementRef, PairDeviation } from './measure/compare.js';

/** Parsing path data and the flat path layout `measureDeviation` takes (`ops` opcodes, `args` numbers). */
export { parsePathData } from './svg/pathData.js';
export type { ParsedPath, PathData } from './svg/pathTypes.js';
export type { Matrix } from './svg/matrixTypes.js';

/** The error for input that is not a readable SVG document (one-line message, 1-based `line` and `column`). */
export { SvgInputError } from './svg/errors.js';
export { decodeSvgBytes } from './svg/decode.js';
export { checkInputSize, DEFAULT_LIMITS } from './limits.js';

/** The package version. */
export { VERSION } from './version.js';
