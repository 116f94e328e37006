/**
 * The G-code writer, read back by gcode-toolpath (npm, a general-purpose
 * RS274 interpreter: its parser gcode-parser reads the words, it runs the
 * modal state and reports each move with the centre it computed from I, J).
 */
import { describe, expect, it } from 'vitest';
import Toolpath from 'gcode-toolpath';
import { GcodeWriter, commentText, gcodeHeader, gcodeNumber } from '../../src/write/gcode.js';
import { BUILTIN_PROFILES, parseProfile } from '../../src/machine/profile.js';
import { rng } from '../rng.js';

interface Read { motion: string; v1: { x: number; y: number }; v2: { x: number; y: number }; v0?: { x: number; y: number } }

function readBack(text: string): Read[] {
  const out: Read[] = [];
  new Toolpath({
    addLine: (m, v1, v2) => out.push({ motion: m.motion, v1, v2 }),
    addArcCurve: (m, v1, v2, v0) => out.push({ motion: m.motion, v1, v2, v0 }),
  }).loadFromStringSync(text);
  return out;
}

const bare = parseProfile({ name: 'bare' });

describe('G-code numbers and comments', () => {
  it('fixed decimals, no exponent, a leading zero, no "-0" (RS274/NGC number syntax, NIST §3.3.2.1)', () => {
    expect(gcodeNumber(1e-7, 4)).toBe('0');
    expect(gcodeNumber(-0.00001, 4)).toBe('0');
    expect(gcodeNumber(0.5, 3)).toBe('0.5');
    expect(gcodeNumber(-0.5, 3)).toBe('-0.5');
    expect(gcodeNumber(12.30049, 3)).toBe('12.3');
    expect(gcodeNumber(1e21, 3)).toBe('1000000000000000000000');
  });
  it('a comment holds no parenthesis or line break (NIST §3.3.4: no "(" inside a comment)', () => {
    expect(commentText('a (b)\nc')).toBe('a [b] c');
    const h = gcodeHeader({ tool: 't', profile: bare, source: 'x (1).svg', toleranceMm: 0.1, deviationMm: 0.05, origin: 'lower-left', seconds: 1 });
    for (const l of h) expect(l).toMatch(/^\([^()\n]*\)$/);
  });
});

describe('G-code writer', () => {
  it('NIST example G1: from (7,7), G2 to (10,16) about (10,11) reads back with centre (10,11), r = 5 at both ends', () => {
    const w = new GcodeWriter({ profile: bare, digits: 4 });
    w.moveTo(7, 7);
    w.arcTo(10, 16, 10, 11, false);
    w.finish();
    expect(w.toString()).toContain('G2 X10 Y16 I3 J4');
    const arcs = readBack(w.toString()).filter((m) => m.v0);
    expect(arcs).toHaveLength(1);
    expect(arcs[0].motion).toBe('G2');
    expect(arcs[0].v0).toMatchObject({ x: 10, y: 11 });
    expect(Math.hypot(arcs[0].v2.x - 10, arcs[0].v2.y - 11)).toBeCloseTo(5, 12);
  });

  it('starts with G21 G90 G17 G94, writes tool lines around work, F once per tool-on', () => {
    const w = new GcodeWriter({ profile: BUILTIN_PROFILES.laser, digits: 3 });
    w.beginElement({ index: 1, label: 'path#a', group: '#000000' });
    w.moveTo(0, 0);
    w.lineTo(10, 0);
    w.lineTo(10, 10);
    w.moveTo(20, 20);
    w.lineTo(30, 20);
    w.finish();
    expect(w.lines()).toEqual([
      'G21 G90 G17 G94', 'M5', '(element 1 path#a stroke #000000)',
      'G0 X0 Y0', 'M4 S1000', 'G1 X10 Y0 F1200', 'G1 X10 Y10', 'M5',
      'G0 X20 Y20', 'M4 S1000', 'G1 X30 Y20 F1200', 'M5', 'M2',
    ]);
  });

  it('a colour with its own power and feed switches the tool and writes them', () => {
    const p = parseProfile({ ...BUILTIN_PROFILES.laser, colours: { '#ff0000': { power: 200, feed: 3000 } } }, BUILTIN_PROFILES.laser);
    const w = new GcodeWriter({ profile: p, digits: 3 });
    w.beginElement({ index: 1, label: 'a', group: '#ff0000' });
    w.moveTo(0, 0);
    w.lineTo(1, 0);
    expect(w.lines().slice(-2)).toEqual(['M4 S200', 'G1 X1 Y0 F3000']);
  });

  it('moves that round onto the current point are left out; a nearly flat arc becomes a line', () => {
    const w = new GcodeWriter({ profile: bare, digits: 3 });
    w.moveTo(0, 0);
    w.lineTo(0.0001, 0.0002);
    w.arcTo(0.0003, 0, 5, 5, true);
    // chord 10 on a radius 1e6: sagitta 1.25e-5 mm, below the quantum
    w.arcTo(10, 0, 5, -1e6, false);
    expect(w.stats).toMatchObject({ skipped: 2, flat: 1, lines: 1, arcs: 0 });
  });

  it('REFERENCES §12.1 G5: with the centre on the rounded chord\'s bisector the read-back radii differ by ≤ √2·q (10⁴ seeded arcs, q = 0.001)', () => {
    const rand = rng(1301);
    const w = new GcodeWriter({ profile: bare, digits: 3 });
    let x = 0, y = 0;
    w.moveTo(x, y);
    for (let k = 0; k < 10_000; k++) {
      const r = 0.5 + rand() * 199.5, a0 = rand() * 2 * Math.PI, sweep = (0.05 + rand() * 0.95) * Math.PI * (rand() < 0.5 ? -1 : 1);
      const cx = x - r * Math.cos(a0), cy = y - r * Math.sin(a0);
      const ex = cx + r * Math.cos(a0 + sweep), ey = cy + r * Math.sin(a0 + sweep);
      w.arcTo(ex, ey, cx, cy, sweep > 0);
      [x, y] = [Number(ex.toFixed(3)), Number(ey.toFixed(3))];
    }
    const arcs = readBack(w.toString()).filter((m) => m.v0);
    expect(arcs.length).toBeGreaterThan(9_900);
    let worst = 0;
    for (const m of arcs) {
      const c = m.v0!;
      worst = Math.max(worst, Math.abs(Math.hypot(m.v1.x - c.x, m.v1.y - c.y) - Math.hypot(m.v2.x - c.x, m.v2.y - c.y)));
    }
    // NIST §3.5.3.2 refuses more than 0.002 mm; the bound is √2·0.001 (plus float noise).
    expect(worst).toBeLessThanOrEqual(Math.SQRT2 * 1e-3 + 1e-9);
  });
});
