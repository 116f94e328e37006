/**
 * The centre on the rounded chord's bisector. Checks from elementary geometry: every point of the
 * perpendicular bisector is as far from both ends of the chord (Euclid I.10–11), and the sagitta of a
 * chord c on a circle of radius r is r − √(r² − (c/2)²) (handbook formula).
 */
import { describe, expect, it } from 'vitest';
import { arcOnRoundedChord } from '../../src/machine/roundedArc.js';

describe('arcOnRoundedChord', () => {
  it('moves a centre given off the bisector onto it: both ends at one radius', () => {
    // The quarter circle (10, 0) → (0, 10) about (0, 0), its centre given 0.003 mm off.
    const a = arcOnRoundedChord(10, 0, 0, 10, 0.003, -0.001, true, 1e-4)!;
    expect(Math.hypot(10 - a.ox, 0 - a.oy)).toBeCloseTo(a.r, 12);
    expect(Math.hypot(0 - a.ox, 10 - a.oy)).toBeCloseTo(a.r, 12);
    // On the bisector x = y, nearest the given centre: ((0.003 − 0.001)/2) on both axes.
    expect(a.ox).toBeCloseTo(0.001, 12);
    expect(a.oy).toBeCloseTo(0.001, 12);
  });

  it('a flat arc (sagitta at most q) is null: a line draws it', () => {
    // Chord 2 on radius 1000: sagitta 1000 − √(1000² − 1) ≈ 0.0005.
    // With the centre below the chord (Y up), clockwise is the short way over the top.
    expect(arcOnRoundedChord(-1, 0, 1, 0, 0, -1000, false, 0.001)).toBeNull();
    expect(arcOnRoundedChord(-1, 0, 1, 0, 0, -1000, false, 0.0004)).not.toBeNull();
    // The same centre taken counter-clockwise is nearly the whole circle: never flat.
    expect(arcOnRoundedChord(-1, 0, 1, 0, 0, -1000, true, 0.001)).not.toBeNull();
  });
});
