import { describe, expect, it } from 'vitest';
import { planContours, travelOf } from '../../src/plan/plan.js';
import type { PlanContour, PlanSettings } from '../../src/plan/types.js';
import { fitPolyline } from '../../src/fit/fitPolyline.js';
import { rng } from '../rng.js';

const TOL = 0.1;
const ALL: PlanSettings = { join: true, overlaps: true, order: true, holesFirst: false, joinDistance: TOL, overlapDistance: TOL / 2, start: [0, 0] };

const stroke = (xy: number[] | Float64Array, element: number, subpath = 0, closed = false, group = '#000000', filled = false): PlanContour =>
  ({ xy: Float64Array.from(xy), closed, group, filled, source: { element, subpath } });
const ringPoint = (k: number, n: number, r: number): [number, number] => [100 + r * Math.cos((2 * Math.PI * k) / n), 100 + r * Math.sin((2 * Math.PI * k) / n)];
const lengthOf = (xy: Float64Array, closed: boolean): number => {
  let l = 0;
  const n = xy.length >> 1;
  for (let k = 1; k < (closed ? n + 1 : n); k++) l += Math.hypot(xy[2 * (k % n)] - xy[2 * k - 2], xy[2 * (k % n) + 1] - xy[2 * k - 1]);
  return l;
};
const polygon = (n: number, r: number): Float64Array => Float64Array.from({ length: 2 * n }, (_, k) => ringPoint(k >> 1, n, r)[k & 1]);

describe('planContours', () => {
  it('joins a ring of 720 line elements into one closed contour that fits as 2 arcs', () => {
    const input = Array.from({ length: 720 }, (_, k) => stroke([...ringPoint(k, 720, 50), ...ringPoint(k + 1, 720, 50)], k));
    const { contours, stats } = planContours(input, ALL);
    expect(contours).toHaveLength(1);
    expect(contours[0].closed).toBe(true);
    expect(stats.piercesBefore).toBe(720);
    expect(stats.piercesAfter).toBe(1);
    expect(stats.contoursJoined).toBe(719);
    expect(stats.doubleLength).toBe(0);
    // 720-gon of circumradius 50: perimeter 720 · 2r · sin(π/720) (chord length).
    expect(lengthOf(contours[0].xy, true)).toBeCloseTo(720 * 100 * Math.sin(Math.PI / 720), 9);
    // A closed smooth contour is written as two arcs (a full circle needs two SVG arc commands, SVG 1.1 F.6).
    const fit = fitPolyline(contours[0].xy, { tolerance: TOL - contours[0].slack, closed: true });
    expect(fit.segments.map((s) => s.kind)).toEqual(['arc', 'arc']);
  });

  it('joins a soup of 720 subpaths "M a L b" of one element, shuffled and reversed', () => {
    const r = rng(12);
    const segs = Array.from({ length: 720 }, (_, k) => (r() < 0.5 ? [...ringPoint(k, 720, 50), ...ringPoint(k + 1, 720, 50)] : [...ringPoint(k + 1, 720, 50), ...ringPoint(k, 720, 50)]));
    for (let i = segs.length - 1; i > 0; i--) {
      const j = Math.floor(r() * (i + 1));
      [segs[i], segs[j]] = [segs[j], segs[i]];
    }
    const { contours, stats } = planContours(segs.map((s, k) => stroke(s, 0, k)), ALL);
    expect(contours).toHaveLength(1);
    expect(contours[0].closed).toBe(true);
    expect(stats.contoursJoined).toBe(719);
    expect(new Set(contours[0].sources.map((s) => s.subpath)).size).toBe(720);
    expect(lengthOf(contours[0].xy, true)).toBeCloseTo(720 * 100 * Math.sin(Math.PI / 720), 9);
  });

  it('draws each edge of a grid of squares once', () => {
    // n × n squares of side s as separate closed paths: 4n²s drawn, 2n(n+1)s unique, 2n(n−1)s removed.
    const n = 5, s = 10;
    const input: PlanContour[] = [];
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) input.push(stroke([i * s, j * s, i * s + s, j * s, i * s + s, j * s + s, i * s, j * s + s], input.length, 0, true));
    const { contours, stats } = planContours(input, ALL);
    expect(stats.doubleLength).toBeCloseTo(2 * n * (n - 1) * s, 9);
    expect(contours.reduce((t, c) => t + lengthOf(c.xy, c.closed), 0)).toBeCloseTo(2 * n * (n + 1) * s, 9);
    // Euler: the grid graph has 4(n−1) vertices of odd degree, so at least 2(n−1) strokes; fewer pierces than squares.
    expect(stats.piercesAfter).toBeGreaterThanOrEqual(2 * (n - 1));
    expect(stats.piercesAfter).toBeLessThan(n * n);
    expect(stats.travelAfter).toBeLessThan(stats.travelBefore);
  });

  it('cuts nested rings from the inside out with holes first', () => {
    // Concentric 90-gons of radius 10, 20, 30, 40 given outermost first: each ring contains the smaller ones.
    const input = [40, 30, 20, 10].map((r, k) => stroke(polygon(90, r), k, 0, true));
    const { contours } = planContours(input, { ...ALL, holesFirst: true });
    expect(contours.map((c) => c.sources[0].element)).toEqual([3, 2, 1, 0]);
    // Each ring keeps its perimeter (90 · 2r · sin(π/90)), only its start vertex moves.
    contours.forEach((c) => expect(lengthOf(c.xy, true)).toBeCloseTo(lengthOf(input[c.sources[0].element].xy, true), 9));
    // Without the order step, holes first alone still puts the inner rings first.
    const stable = planContours(input, { ...ALL, order: false, holesFirst: true });
    expect(stable.contours.map((c) => c.sources[0].element)).toEqual([3, 2, 1, 0]);
  });

  it('never joins, de-duplicates or reorders across colours', () => {
    const input = [
      stroke([0, 0, 10, 0], 0, 0, false, 'red'),
      stroke([0, 0, 10, 0], 1, 0, false, 'blue'),
      stroke([10, 0, 20, 0], 2, 0, false, 'blue'),
      stroke([20, 5, 10, 0], 3, 0, false, 'red'),
    ];
    const { contours, stats } = planContours(input, ALL);
    expect(stats.doubleLength).toBe(0);
    // Red 0 + 3 join (they meet at (10,0)), blue 1 + 2 join: two contours, red first (it appears first).
    expect(contours.map((c) => c.group)).toEqual(['red', 'blue']);
    for (const c of contours) for (const src of c.sources) expect(input[src.element].group).toBe(c.group);
    expect(stats.contoursJoined).toBe(2);
  });

  it('leaves filled shapes untouched, in their place', () => {
    const sq = [0, 0, 10, 0, 10, 10, 0, 10];
    const input = [
      stroke([50, 50, 60, 50], 0),
      stroke(sq, 1, 0, true, '#000000', true),
      stroke(sq, 2, 0, true, '#000000', true),
      stroke(sq, 3, 0, true),
      stroke([0, 0, 10, 0], 4),
    ];
    const { contours, stats } = planContours(input, ALL);
    // The two equal filled squares stay, as the same arrays, in their order; only the stroke line over the stroked square's edge goes.
    const filled = contours.filter((c) => c.filled);
    expect(filled.map((c) => c.xy)).toEqual([input[1].xy, input[2].xy]);
    expect(filled[0].xy).toBe(input[1].xy);
    expect(stats.doubleLength).toBeCloseTo(10, 9);
    expect(contours.indexOf(filled[0])).toBeGreaterThan(0);
  });

  it('removes reversed and partial overlaps and reports their length', () => {
    const input = [stroke([0, 0, 100, 0], 0), stroke([100, 0, 0, 0], 1), stroke([50, 0, 150, 0], 2)];
    const { contours, stats } = planContours(input, ALL);
    // Reversed duplicate: 100 mm; partial overlap of [50, 150] with [0, 100]: 50 mm (interval arithmetic).
    expect(stats.doubleLength).toBeCloseTo(150, 9);
    expect(stats.doubleContours).toBe(2);
    // What is left joins into one straight line from 0 to 150.
    expect(contours).toHaveLength(1);
    expect(lengthOf(contours[0].xy, false)).toBeCloseTo(150, 9);
  });

  it('reports how far each planned contour may lie from its input (slack)', () => {
    // A join across a 0.06 mm gap draws a connecting line within half the gap of an input end: slack 0.03.
    const joined = planContours([stroke([0, 0, 10, 0], 0), stroke([10.06, 0, 20, 0], 1)], ALL);
    expect(joined.contours[0].slack).toBeCloseTo(0.03, 12);
    // A group that lost a double line: its kept lines stand for removed ones within the overlap distance.
    const doubled = planContours([stroke([0, 0, 10, 0], 0), stroke([0, 0.02, 10, 0.02], 1), stroke([0, 5, 10, 5], 2, 0, false, 'red')], ALL);
    expect(doubled.contours.map((c) => c.slack)).toEqual([ALL.overlapDistance, 0]);
    expect(planContours([stroke([0, 0, 10, 0], 0)], ALL).contours[0].slack).toBe(0);
  });

  it('changes nothing with every step off', () => {
    const input = [stroke([0, 0, 10, 0], 0), stroke([0, 0, 10, 0], 1), stroke([30, 0, 20, 0], 2)];
    const { contours, stats } = planContours(input, { ...ALL, join: false, overlaps: false, order: false });
    expect(contours.map((c) => c.xy)).toEqual(input.map((c) => c.xy));
    expect(stats.travelAfter).toBe(stats.travelBefore);
    expect(stats.travelBefore).toBe(travelOf(input, [0, 0]));
  });
});
