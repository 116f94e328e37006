/**
 * Machine profiles: the built-ins and a user profile validate against
 * schema/profile.schema.json (validator: ajv, npm, JSON Schema draft 2020-12),
 * and every bad profile below is refused both by the schema and by
 * parseProfile, with a one-line message naming the field.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { BUILTIN_PROFILES, ProfileError, colourSettings, fillLine, loadProfile, parseProfile } from '../../src/machine/profile.js';

const schema = JSON.parse(readFileSync(new URL('../../schema/profile.schema.json', import.meta.url), 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: true });
const validate = ajv.compile(schema);

/** The README's example profile (our own scenario: a laser cutting black, engraving red). */
const example = {
  name: 'my-laser', description: 'diode laser, 10 W',
  travelFeed: 6000, workFeed: 900, power: 800,
  colours: { '#ff0000': { power: 250, feed: 3000 } },
  preamble: ['M5'], toolOn: ['M4 S{power}'], toolOff: ['M5'], end: ['M5', 'G0 X0 Y0', 'M2'],
  acceleration: 800, junctionDeviation: 0.02, lookAhead: 32,
};

const bad: [string, unknown, RegExp][] = [
  ['unknown field', { speed: 100 }, /unknown profile field "speed"/],
  ['negative feed', { workFeed: -1 }, /"workFeed".*-1/],
  ['feed as text', { workFeed: '1000' }, /"workFeed".*"1000"/],
  ['look-ahead not whole', { lookAhead: 2.5 }, /"lookAhead".*2.5/],
  ['upper-case colour key', { colours: { '#FF0000': { power: 1 } } }, /#FF0000/],
  ['colour field unknown', { colours: { '#ff0000': { speed: 1 } } }, /unknown field "speed"/],
  ['two lines in one entry', { toolOn: ['M3\nM4'] }, /"toolOn"/],
  ['unknown placeholder', { toolOn: ['M3 S{powr}'] }, /\{powr\}/],
  ['lines not a list', { end: 'M2' }, /"end"/],
  ['name with a parenthesis', { name: 'a(b' }, /"name"/],
];

describe('machine profiles', () => {
  it('the built-ins and the README example validate against the schema and parse unchanged', () => {
    for (const p of [...Object.values(BUILTIN_PROFILES), example]) {
      expect(validate(p), JSON.stringify(validate.errors)).toBe(true);
      const parsed = parseProfile(p);
      for (const [k, v] of Object.entries(p)) expect(parsed[k as keyof typeof parsed]).toEqual(v);
    }
  });

  it.each(bad)('refuses a profile with %s (schema and parser agree)', (_what, value, message) => {
    expect(validate(value)).toBe(false);
    expect(() => parseProfile(value)).toThrow(ProfileError);
    expect(() => parseProfile(value)).toThrow(message);
  });

  // Words from RS274NGC v3 (NIST): X, Y, I, J, R place moves in the plane; G20 inches, G91 relative, G92 offsets.
  it.each(['G0 X0 Y0', 'G2 I1 J0', 'G91', 'G92 X0', 'G20'])('refuses a tool line that moves the head or changes the frame: %s', (line) => {
    expect(() => parseProfile({ name: 'x', toolOn: [line] })).toThrow(/would move the head or change the coordinates between cuts/);
    expect(() => parseProfile({ name: 'x', toolOff: [line] })).toThrow(ProfileError);
  });

  it('keeps Z moves, dwells, spindle and laser words in tool lines, comments aside, and any move in the end block', () => {
    expect(() => parseProfile({ name: 'x', toolOn: ['G1 Z0 F600', 'M4 S{power}', 'G4 P0.2', 'M3 S1000 (X marks the spot)'], toolOff: ['G0 Z5'] })).not.toThrow();
    expect(parseProfile({ name: 'x', end: ['G0 X0 Y0', 'M2'] }).end).toEqual(['G0 X0 Y0', 'M2']);
  });

  it('an empty profile is valid and takes the laser numbers with no lines', () => {
    expect(validate({})).toBe(true);
    const p = parseProfile({});
    expect(p.workFeed).toBe(BUILTIN_PROFILES.laser.workFeed);
    expect(p.toolOn).toEqual([]);
  });

  it('loads built-ins by name and JSON text, with one-line errors otherwise', () => {
    expect(loadProfile('pen-z').toolOff).toEqual(['G0 Z5']);
    expect(loadProfile(JSON.stringify(example)).name).toBe('my-laser');
    expect(() => loadProfile('plasma')).toThrow(/unknown machine profile "plasma" \(built in: laser, pen-z, pen-servo/);
    expect(() => loadProfile('{"name": ')).toThrow(/not valid JSON/);
    expect(() => loadProfile('constructor')).toThrow(/unknown machine profile/);
  });

  it('colour settings fall back to the profile defaults; placeholders are filled', () => {
    const p = parseProfile(example);
    expect(colourSettings(p, '#ff0000')).toEqual({ power: 250, feed: 3000 });
    expect(colourSettings(p, '#000000')).toEqual({ power: 800, feed: 900 });
    expect(fillLine('M4 S{power} F{feed}', 250, 3000, String)).toBe('M4 S250 F3000');
  });
});
