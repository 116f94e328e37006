/**
 * The motion model against closed forms. Values: ../shared/REFERENCES.md §13.5
 * (M1–M4c), computed there from the textbook trapezoid profile (L = v·t with
 * accelerate/decelerate v/a each), uniform circular motion (v = √(a·r)) and
 * the junction construction of §13.2; a = 500 mm/s² unless noted.
 */
import { describe, expect, it } from 'vitest';
import { estimateTime, junctionSpeed, moveTime, planSpeeds, type MotionParams } from '../../src/machine/motion.js';
import type { MachineMove } from '../../src/machine/sink.js';

const A = 500;
const params = (feedMmS: number, over: Partial<MotionParams> = {}): MotionParams => ({
  acceleration: A, junctionDeviation: 0.05, lookAhead: 16, travelFeed: 60 * 1000, workFeed: () => 60 * feedMmS, toolSwitchSeconds: 0, ...over,
});
const line = (x0: number, y0: number, x: number, y: number): MachineMove => ({ kind: 'line', x0, y0, x, y, group: 'none' });

describe('one move (trapezoid and triangle, REFERENCES §13.1)', () => {
  it('M1: L = 10 mm at 50 mm/s, rest to rest: trapezoid L/v + v/a = 0.3 s', () => {
    expect(moveTime(10, 0, 0, 50, A)).toBeCloseTo(0.3, 9);
  });
  it('M1b: L = 5 (boundary v²/a) 0.2 s; L = 2 triangle 2√(L/a) = 0.126491 s', () => {
    expect(moveTime(5, 0, 0, 50, A)).toBeCloseTo(0.2, 9);
    expect(moveTime(2, 0, 0, 50, A)).toBeCloseTo(2 * Math.sqrt(2 / A), 12);
    expect(moveTime(2, 0, 0, 50, A)).toBeCloseTo(0.126491, 6);
  });
  it('M1c: entry and exit speeds: 0.282000 s and 0.021980 s', () => {
    expect(moveTime(10, 10, 0, 50, A)).toBeCloseTo(0.282, 6);
    expect(moveTime(0.5, 20, 20, 50, A)).toBeCloseTo(0.02198, 5);
  });
  it('the whole program of one line is that trapezoid', () => {
    const e = estimateTime([line(0, 0, 10, 0)], params(50));
    expect(e.seconds).toBeCloseTo(0.3, 9);
    expect(e.workLength).toBeCloseTo(10, 12);
  });
});

describe('junction speed (REFERENCES §13.2, M2: δ = 0.05 mm)', () => {
  // v_j = √(a·δ·s/(1 − s)), s = sin(θ/2), θ = 180° − turn.
  const cases: [number, number][] = [[10, 80.8998], [30, 26.6213], [60, 12.7123], [90, 7.7689], [120, 5.0], [150, 2.9546], [170, 1.545]];
  it.each(cases)('a turn of %i° gives %f mm/s', (turn, v) => {
    const t = (turn * Math.PI) / 180;
    expect(junctionSpeed(1, 0, Math.cos(t), Math.sin(t), A, 0.05)).toBeCloseTo(v, 3);
  });
  it('straight on is unlimited, a reversal stops', () => {
    expect(junctionSpeed(1, 0, 1, 0, A, 0.05)).toBe(Infinity);
    expect(junctionSpeed(1, 0, -1, 0, A, 0.05)).toBe(0);
  });
});

describe('arcs at v = √(a·r) (REFERENCES §13.3, M3)', () => {
  it('a full circle r = 5 as two half arcs, feed above the cap: rest to rest 0.728319 s', () => {
    // Cap √(500·5) = 50 mm/s; accelerate and decelerate 0.1 s each over 2.5 mm, cruise (10π − 5)/50.
    const moves: MachineMove[] = [
      { kind: 'arc', x0: 5, y0: 0, x: -5, y: 0, cx: 0, cy: 0, ccw: true, group: 'none' },
      { kind: 'arc', x0: -5, y0: 0, x: 5, y: 0, cx: 0, cy: 0, ccw: true, group: 'none' },
    ];
    const e = estimateTime(moves, params(100));
    expect(e.workLength).toBeCloseTo(10 * Math.PI, 9);
    expect(e.seconds).toBeCloseTo(0.728319, 6);
    // Without the acceleration at the ends the same circle takes 2πr/√(a·r) = 0.628319 s: the difference is v/a.
    expect(e.seconds - (2 * Math.PI * 5) / Math.sqrt(A * 5)).toBeCloseTo(50 / A, 9);
  });
  it('clockwise arcs take the same time', () => {
    const moves: MachineMove[] = [
      { kind: 'arc', x0: 5, y0: 0, x: -5, y: 0, cx: 0, cy: 0, ccw: false, group: 'none' },
      { kind: 'arc', x0: -5, y0: 0, x: 5, y: 0, cx: 0, cy: 0, ccw: false, group: 'none' },
    ];
    expect(estimateTime(moves, params(100)).seconds).toBeCloseTo(0.728319, 6);
  });
});

describe('look-ahead (REFERENCES §13.4)', () => {
  it('M4: 10 mm square at 50 mm/s, δ = 0.05: 1.114016 s', () => {
    const sq = [line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 10), line(0, 10, 0, 0)];
    expect(estimateTime(sq, params(50)).seconds).toBeCloseTo(1.114016, 5);
  });
  it('M4c: the two passes, forward and reversed, give the same speeds mirrored and T = 0.530296 s', () => {
    const L = [0.5, 0.5, 0.5, 20, 0.5];
    const v = planSpeeds(L, Float64Array.of(0, 40, 40, 40, 3, 0), A);
    [0, 22.36068, 31.622777, 38.729833, 3, 0].forEach((x, i) => expect(v[i]).toBeCloseTo(x, 5));
    const r = planSpeeds(L.slice().reverse(), Float64Array.of(0, 3, 40, 40, 40, 0), A);
    [0, 3, 38.729833, 31.622777, 22.36068, 0].forEach((x, i) => expect(r[i]).toBeCloseTo(x, 5));
    const T = L.reduce((s, l, j) => s + moveTime(l, v[j], v[j + 1], 60, A), 0);
    expect(T).toBeCloseTo(0.530296, 5);
  });
  it('a planner holding one move stops after every move: n collinear pieces take n rest-to-rest moves', () => {
    const pieces = Array.from({ length: 10 }, (_, k) => line(k, 0, k + 1, 0));
    const one = estimateTime(pieces, params(50, { lookAhead: 1 })).seconds;
    expect(one).toBeCloseTo(10 * 2 * Math.sqrt(1 / A), 9); // triangle of 1 mm each (1 < v²/a = 5)
    // A window over the whole line is the single 10 mm move of M1.
    expect(estimateTime(pieces, params(50, { lookAhead: 16 })).seconds).toBeCloseTo(0.3, 9);
    // In between: holding 3 moves, the speed at the end of the running one is at most √(2a·2 mm).
    const three = estimateTime(pieces, params(50, { lookAhead: 3 })).seconds;
    expect(three).toBeGreaterThan(0.3);
    expect(three).toBeLessThan(one);
  });
  it('travel and work: a tool switch is a stop, and costs the profile seconds', () => {
    const moves: MachineMove[] = [{ kind: 'travel', x0: 0, y0: 0, x: 10, y: 0, group: 'none' }, line(10, 0, 20, 0)];
    const e = estimateTime(moves, params(50, { travelFeed: 60 * 50, toolSwitchSeconds: 0.25 }));
    expect(e.travelSeconds).toBeCloseTo(0.3, 9);
    expect(e.workSeconds).toBeCloseTo(0.3, 9);
    expect(e.switchSeconds).toBeCloseTo(0.5, 12); // on, then off at the end
  });
});
