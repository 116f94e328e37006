/**
 * Machine profiles: how one machine turns its tool on and off, how fast it
 * moves, and what a program starts and ends with. A profile is a JSON object of
 * our own design, documented field by field in schema/profile.schema.json;
 * {@link parseProfile} checks one the same way (every problem is one line
 * naming the field and the bad value) and fills the optional fields.
 *
 * Lines may hold `{power}` and `{feed}`, replaced by the stroke colour's
 * power and work feed (mm/min). The writer always starts a program with
 * G21 G90 G17 G94 itself (millimetres, absolute, XY plane, feed per minute):
 * the written numbers mean nothing without them.
 */
import { OptionError } from '../options.js';

/** Settings for the strokes of one colour. */
export interface ColourSettings {
  /** Value put in for `{power}` (the machine's own scale, e.g. S0–S1000). */
  power?: number;
  /** Work feed, mm/min. */
  feed?: number;
}

export interface MachineProfile {
  /** Short name, shown in the program header. */
  name: string;
  /** One line saying what machine this is for. */
  description: string;
  /** Travel (G0) speed in mm/min; G0 carries no F word, this only feeds the time estimate. */
  travelFeed: number;
  /** Work feed (F) in mm/min for colours without their own. */
  workFeed: number;
  /** Power put in for `{power}` for colours without their own. */
  power: number;
  /** Per stroke colour (`#rrggbb`, lower case), power and feed. */
  colours: Record<string, ColourSettings>;
  /** Lines after the writer's own G21 G90 G17 G94. */
  preamble: string[];
  /** Lines that start the tool (before the first work move after travel). */
  toolOn: string[];
  /** Lines that stop the tool (before travel, and at the end). */
  toolOff: string[];
  /** Lines at the end of the program (after the last tool-off, which the writer always adds). */
  end: string[];
  /** Time model: path acceleration limit, mm/s². */
  acceleration: number;
  /** Time model: corner parameter δ of the junction speed, mm (../../shared/REFERENCES.md §13.2). */
  junctionDeviation: number;
  /** Time model: how many moves ahead the planner sees. */
  lookAhead: number;
  /** Time model: seconds for each tool-on or tool-off (a pen's drop or lift, a dwell). */
  toolSwitchSeconds: number;
}

/** One-line error about a profile (an option error: the user can fix it); the message names the field and the bad value. */
export class ProfileError extends OptionError {
  override name = 'ProfileError';
}

const COMMON = { colours: {}, acceleration: 500, junctionDeviation: 0.05, lookAhead: 16 } as const;

/**
 * Built-in profiles. Their lines are starting points to check against the
 * machine's manual, not settings known to suit a particular machine.
 */
export const BUILTIN_PROFILES: Readonly<Record<string, MachineProfile>> = Object.freeze({
  // M4 (with S power) is the dynamic-power laser mode of common small controllers: the power
  // follows the actual speed, so corners and arc ends are not burnt deeper. M5 before every
  // travel keeps the beam off on controllers without a laser mode too.
  laser: {
    name: 'laser', description: 'generic diode or CO2 laser: M4 S<power> on, M5 off',
    travelFeed: 6000, workFeed: 1200, power: 1000, ...COMMON,
    preamble: ['M5'], toolOn: ['M4 S{power}'], toolOff: ['M5'], end: ['M2'], toolSwitchSeconds: 0,
  },
  'pen-z': {
    name: 'pen-z', description: 'pen plotter or drag knife moved in Z: down to Z0, up to Z5',
    travelFeed: 3000, workFeed: 1500, power: 0, ...COMMON,
    preamble: ['G0 Z5'], toolOn: ['G1 Z0 F600'], toolOff: ['G0 Z5'], end: ['M2'], toolSwitchSeconds: 0.1,
  },
  'pen-servo': {
    name: 'pen-servo', description: 'pen lifted by a servo on the spindle output: M3 S<power> down, M5 up, with a dwell',
    travelFeed: 3000, workFeed: 1500, power: 30, ...COMMON,
    preamble: ['M5', 'G4 P0.2'], toolOn: ['M3 S{power}', 'G4 P0.2'], toolOff: ['M5', 'G4 P0.2'], end: ['M2'], toolSwitchSeconds: 0.2,
  },
});

const LIMITS = { feed: [0.001, 1e6], acceleration: [0.001, 1e7], junctionDeviation: [0, 100], lookAhead: [1, 10000], toolSwitchSeconds: [0, 3600] } as const;
const KNOWN = new Set(['$schema', 'name', 'description', 'travelFeed', 'workFeed', 'power', 'colours', 'preamble', 'toolOn', 'toolOff', 'end',
  'acceleration', 'junctionDeviation', 'lookAhead', 'toolSwitchSeconds']);
const COLOUR = /^#[0-9a-f]{6}$/;

function num(o: Record<string, unknown>, key: string, lo: number, hi: number, fallback: number | undefined, int = false): number {
  const v = o[key] ?? fallback;
  if (typeof v !== 'number' || !Number.isFinite(v) || v < lo || v > hi || (int && !Number.isInteger(v))) {
    throw new ProfileError(`profile field "${key}" must be a ${int ? 'whole ' : ''}number from ${lo} to ${hi}, got ${JSON.stringify(o[key])}`);
  }
  return v;
}

/**
 * Lines the program runs between cuts must not move the head in the plane or change how coordinates are read:
 * the writer's next move would then start elsewhere than it thinks (a tool-on line `G0 X0 Y0` made a cut from
 * the origin). Refused: X, Y, I, J and R words, and G20 (inches), G91 (relative), G92 (offset) (RS274NGC v3
 * §3.5, from memory). Z moves, dwells (G4 P…), spindle and laser words are fine; the end block may move home.
 */
function refuseMotion(key: string, line: string): void {
  const code = line.replace(/\([^)]*\)/g, ' ').replace(/;.*$/, '');
  const word = /(?:^|[^A-Z])([XYIJR])\s*[-+.\d{]/i.exec(code) ?? /(?:^|[^A-Z\d.])(G\s*0*(?:20|91|92))(?![\d.])/i.exec(code);
  if (word) throw new ProfileError(`profile field "${key}" holds ${JSON.stringify(line)}: ${word[1].toUpperCase()} would move the head or change the coordinates between cuts (only the end block may)`);
}

function lines(o: Record<string, unknown>, key: string, fallback: string[] | undefined): string[] {
  const v = o[key] ?? fallback;
  if (!Array.isArray(v)) throw new ProfileError(`profile field "${key}" must be a list of G-code lines, got ${JSON.stringify(o[key])}`);
  for (const s of v) {
    if (typeof s !== 'string' || /[\r\n]/.test(s)) throw new ProfileError(`profile field "${key}" holds ${JSON.stringify(s)}: each entry must be one line of text`);
    const bad = /\{(?!power\}|feed\})[^}]*\}/.exec(s);
    if (bad) throw new ProfileError(`profile field "${key}" holds an unknown placeholder ${bad[0]} in ${JSON.stringify(s)} (known: {power}, {feed})`);
    if (key !== 'end') refuseMotion(key, s);
  }
  return v.slice() as string[];
}

/**
 * Check a profile object (parsed JSON) and fill optional fields from `base`
 * (default: the built-in laser profile's numbers, empty line lists).
 * @throws ProfileError naming the first bad field
 */
export function parseProfile(value: unknown, base?: MachineProfile): MachineProfile {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw new ProfileError(`a machine profile must be a JSON object, got ${JSON.stringify(value)}`);
  const o = value as Record<string, unknown>;
  for (const k of Object.keys(o)) if (!KNOWN.has(k)) throw new ProfileError(`unknown profile field "${k}" (known: ${[...KNOWN].slice(1).join(', ')})`);
  const b = base ?? { ...BUILTIN_PROFILES.laser, preamble: [], toolOn: [], toolOff: [], end: [] };
  const name = o.name ?? b.name;
  if (typeof name !== 'string' || name.length === 0 || /[\r\n()]/.test(name)) throw new ProfileError(`profile field "name" must be a non-empty one-line text without parentheses, got ${JSON.stringify(o.name)}`);
  const description = o.description ?? b.description;
  if (typeof description !== 'string') throw new ProfileError(`profile field "description" must be text, got ${JSON.stringify(o.description)}`);
  const colours: Record<string, ColourSettings> = {};
  const c = o.colours ?? b.colours;
  if (typeof c !== 'object' || c === null || Array.isArray(c)) throw new ProfileError(`profile field "colours" must be an object keyed by #rrggbb, got ${JSON.stringify(o.colours)}`);
  for (const [key, s] of Object.entries(c as Record<string, unknown>)) {
    if (!COLOUR.test(key)) throw new ProfileError(`profile colour key ${JSON.stringify(key)} must be #rrggbb in lower case`);
    if (typeof s !== 'object' || s === null || Array.isArray(s)) throw new ProfileError(`profile colour ${key} must be an object with power and/or feed, got ${JSON.stringify(s)}`);
    const e = s as Record<string, unknown>;
    for (const k of Object.keys(e)) if (k !== 'power' && k !== 'feed') throw new ProfileError(`unknown field "${k}" in profile colour ${key} (known: power, feed)`);
    colours[key] = {};
    if (e.power !== undefined) colours[key].power = num(e, 'power', 0, 1e9, undefined);
    if (e.feed !== undefined) colours[key].feed = num(e, 'feed', LIMITS.feed[0], LIMITS.feed[1], undefined);
  }
  return {
    name, description,
    travelFeed: num(o, 'travelFeed', LIMITS.feed[0], LIMITS.feed[1], b.travelFeed),
    workFeed: num(o, 'workFeed', LIMITS.feed[0], LIMITS.feed[1], b.workFeed),
    power: num(o, 'power', 0, 1e9, b.power),
    colours,
    preamble: lines(o, 'preamble', b.preamble), toolOn: lines(o, 'toolOn', b.toolOn),
    toolOff: lines(o, 'toolOff', b.toolOff), end: lines(o, 'end', b.end),
    acceleration: num(o, 'acceleration', LIMITS.acceleration[0], LIMITS.acceleration[1], b.acceleration),
    junctionDeviation: num(o, 'junctionDeviation', LIMITS.junctionDeviation[0], LIMITS.junctionDeviation[1], b.junctionDeviation),
    lookAhead: num(o, 'lookAhead', LIMITS.lookAhead[0], LIMITS.lookAhead[1], b.lookAhead, true),
    toolSwitchSeconds: num(o, 'toolSwitchSeconds', LIMITS.toolSwitchSeconds[0], LIMITS.toolSwitchSeconds[1], b.toolSwitchSeconds),
  };
}

/**
 * A built-in profile by name, or a profile from JSON text (numbers left out
 * take the built-in laser profile's, line lists left out are empty).
 * @throws ProfileError for an unknown name or a bad profile
 */
export function loadProfile(nameOrJson: string): MachineProfile {
  const builtin = Object.prototype.hasOwnProperty.call(BUILTIN_PROFILES, nameOrJson) ? BUILTIN_PROFILES[nameOrJson] : undefined;
  if (builtin) return parseProfile(builtin, builtin);
  let value: unknown;
  try {
    value = JSON.parse(nameOrJson);
  } catch (e) {
    const known = Object.keys(BUILTIN_PROFILES).join(', ');
    if (!/^\s*\{/.test(nameOrJson)) throw new ProfileError(`unknown machine profile "${nameOrJson}" (built in: ${known}; or a JSON profile file)`);
    throw new ProfileError(`machine profile is not valid JSON: ${(e as Error).message}`);
  }
  return parseProfile(value);
}

/** Power and work feed (mm/min) for strokes of one colour. */
export function colourSettings(p: MachineProfile, group: string): { power: number; feed: number } {
  const s = Object.prototype.hasOwnProperty.call(p.colours, group) ? p.colours[group] : undefined;
  return { power: s?.power ?? p.power, feed: s?.feed ?? p.workFeed };
}

/** A profile line with `{power}` and `{feed}` put in (numbers written by `fmt`). */
export function fillLine(line: string, power: number, feed: number, fmt: (v: number) => string): string {
  return line.replace(/\{power\}/g, fmt(power)).replace(/\{feed\}/g, fmt(feed));
}
