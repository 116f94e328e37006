/**
 * A machine file from a fitted drawing, proven on the written text: write
 * (G-code or DXF), read it back with an independent reader, measure every
 * element against its original in machine coordinates, estimate the machine
 * time. Pure: a drawing in, text and a verdict out.
 */
import { pageToMachine, type MachineDrawing, type MachineOrigin } from './drawing.js';
import { emitMachine, emitPolylines, type PagePolyline } from './emit.js';
import { RecordingMachineSink } from './sink.js';
import { colourSettings, type MachineProfile } from './profile.js';
import { machineDigits } from './digits.js';
import { estimateTime, type MotionEstimate, type MotionParams } from './motion.js';
import { readBackDxf, readBackGcode, type ReadBack } from './readback.js';
import { PROOF_ERROR_FRACTION, PROOF_SPACING_FACTOR, proveMachine, type MachineProof } from './proof.js';
import { GcodeWriter, gcodeHeader } from '../write/gcode.js';
import { DxfWriter } from '../write/dxf.js';
import { VERSION } from '../version.js';

export type MachineFormat = 'gcode' | 'dxf';

/** Options of {@link writeMachineFile}. */
export interface MachineFileOptions {
  format: MachineFormat;
  /** mm, the tolerance the drawing was fitted within. */
  tolerance: number;
  profile: MachineProfile;
  /** Where the machine origin sits on the page (default lower-left). */
  origin?: MachineOrigin;
  /** Decimals; default from the tolerance (./digits.ts). */
  digits?: number | null;
}

/** The written file and its proof. */
export interface MachineFile {
  text: string;
  format: MachineFormat;
  digits: number;
  /** Lines of the file (G-code: program lines; DXF: text lines). */
  lines: number;
  moves: { travels: number; lines: number; arcs: number };
  proof: MachineProof;
  /** Estimated machine time of the program (G-code and DXF alike, with the profile's feeds). */
  time: MotionEstimate;
  /** ms per stage. */
  ms: { write: number; readBack: number; measure: number; estimate: number };
}

/** Motion-model parameters of a profile. */
export function motionParams(p: MachineProfile): MotionParams {
  return {
    acceleration: p.acceleration, junctionDeviation: p.junctionDeviation, lookAhead: p.lookAhead,
    travelFeed: p.travelFeed, workFeed: (g) => colourSettings(p, g).feed, toolSwitchSeconds: p.toolSwitchSeconds,
  };
}

function countLines(s: string): number {
  let n = 0;
  for (let i = s.indexOf('\n'); i >= 0; i = s.indexOf('\n', i + 1)) n++;
  return n;
}

/**
 * Write a drawing as G-code or DXF and prove the written text.
 * The G-code header (comments only, so it changes no move) states the
 * deviation measured on the program read back without it.
 */
export function writeMachineFile(drawing: MachineDrawing, o: MachineFileOptions): MachineFile {
  const origin = o.origin ?? 'lower-left';
  const frame = pageToMachine(drawing.pageHeightMm, origin);
  const digits = o.digits ?? machineDigits(o.tolerance);
  const chord = o.tolerance * PROOF_ERROR_FRACTION, spacing = o.tolerance * PROOF_SPACING_FACTOR;
  let t = performance.now();
  let body: string, read: ReadBack, moves: MachineFile['moves'];
  let tRead: number;
  if (o.format === 'gcode') {
    const w = new GcodeWriter({ profile: o.profile, digits });
    emitMachine(w, drawing.elements, frame);
    w.finish();
    body = w.toString();
    moves = { travels: w.stats.travels, lines: w.stats.lines, arcs: w.stats.arcs };
    tRead = performance.now();
    read = readBackGcode(body, chord, spacing);
  } else {
    const w = new DxfWriter(digits);
    emitMachine(w, drawing.elements, frame);
    w.finish();
    body = w.toString();
    moves = { travels: 0, lines: w.stats.lines, arcs: w.stats.arcs };
    tRead = performance.now();
    read = readBackDxf(body, w.spans, chord, spacing);
    if (read.units !== 4) throw new Error(`internal: the DXF reader saw $INSUNITS ${read.units}, not 4 (mm)`);
  }
  const write = tRead - t;
  t = performance.now();
  const readBack = t - tRead;
  const proof = proveMachine(drawing.elements, read, frame, o.tolerance);
  const measure = performance.now() - t;
  t = performance.now();
  const rec = new RecordingMachineSink();
  emitMachine(rec, drawing.elements, frame);
  const time = estimateTime(rec.moves, motionParams(o.profile));
  const estimate = performance.now() - t;
  const text = o.format === 'gcode'
    ? gcodeHeader({
      tool: `arcspline ${VERSION}`, profile: o.profile, source: drawing.source, toleranceMm: o.tolerance,
      deviationMm: proof.elements.some((e) => e.deviation) ? proof.maxDeviation : null, origin, seconds: time.seconds,
    }).join('\n') + '\n' + body
    : body;
  return { text, format: o.format, digits, lines: countLines(text), moves, proof, time, ms: { write, readBack, measure, estimate } };
}

/** The same drawing as straight moves: lines of G-code and estimated time (the baseline). */
export interface StraightProgram {
  lines: number;
  moves: number;
  /** Vertices that rounded onto the previous one (no line written). */
  skipped: number;
  time: MotionEstimate;
}

/**
 * Estimated time and move count of polylines (page mm) as straight moves only,
 * without writing them: the baseline of the summary.
 */
export function straightEstimate(
  elements: readonly { index: number; label: string; group: string; polylines: readonly PagePolyline[] }[],
  pageHeightMm: number, profile: MachineProfile, origin: MachineOrigin = 'lower-left',
): { moves: number; time: MotionEstimate } {
  const rec = new RecordingMachineSink();
  const stats = emitPolylines(rec, elements, pageToMachine(pageHeightMm, origin));
  return { moves: stats.lines, time: estimateTime(rec.moves, motionParams(profile)) };
}

/**
 * Write polylines (page mm) as a G1-only program with the same profile and
 * digits, to compare with the refit.
 */
export function straightProgram(
  elements: readonly { index: number; label: string; group: string; polylines: readonly PagePolyline[] }[],
  pageHeightMm: number, profile: MachineProfile, digits: number, origin: MachineOrigin = 'lower-left',
): StraightProgram & { text: string } {
  const frame = pageToMachine(pageHeightMm, origin);
  const w = new GcodeWriter({ profile, digits });
  emitPolylines(w, elements, frame);
  w.finish();
  const rec = new RecordingMachineSink();
  emitPolylines(rec, elements, frame);
  const text = w.toString();
  return { text, lines: countLines(text), moves: w.stats.lines, skipped: w.stats.skipped, time: estimateTime(rec.moves, motionParams(profile)) };
}
