/**
 * Path-plan benchmark (issue: the path plan): pen-up travel against the
 * spanning-tree lower bound (src/plan/bound.ts) and against a plain nearest-neighbour
 * order run here in the same process; travel before and after on a generated
 * drawing; plan time for 10,000 contours; 100,000 contours in a fresh process
 * with its peak memory (bench/planBig.ts). Seeded; figures are medians.
 * Run: npm run bench (all benchmarks) or npx tsx bench/plan.ts.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { planContours, travelOf } from '../src/plan/plan.js';
import { travelLowerBound } from '../src/plan/bound.js';
import type { PlanContour, PlanSettings } from '../src/plan/types.js';
import { hatchedDrawing, randomStrokes } from './planCases.js';
import { consume, fmt, median, timeMedian } from './stats.js';

const TOL = 0.1;
export const ALL_STEPS: PlanSettings = { join: true, overlaps: true, order: true, holesFirst: false, joinDistance: TOL, overlapDistance: TOL / 2, start: null };
const ORDER_ONLY: PlanSettings = { ...ALL_STEPS, join: false, overlaps: false };

/**
 * Baseline: nearest neighbour, the textbook construction, by brute force (O(n²)): from the current
 * exit to the nearest end of any contour not yet drawn, entering there. Returns its travel (mm).
 */
function nearestNeighbourTravel(cs: readonly PlanContour[]): number {
  const n = cs.length, done = new Uint8Array(n);
  let x = cs[0].xy[0], y = cs[0].xy[1], travel = 0;
  for (let k = 0; k < n; k++) {
    let best = -1, bestD = Infinity, bestEnd = 0;
    for (let i = 0; i < n; i++) {
      if (done[i]) continue;
      const xy = cs[i].xy, m = xy.length;
      const d0 = (xy[0] - x) ** 2 + (xy[1] - y) ** 2, d1 = (xy[m - 2] - x) ** 2 + (xy[m - 1] - y) ** 2;
      if (d0 < bestD) [best, bestD, bestEnd] = [i, d0, 0];
      if (d1 < bestD) [best, bestD, bestEnd] = [i, d1, 1];
    }
    done[best] = 1;
    if (k > 0) travel += Math.sqrt(bestD);
    const xy = cs[best].xy, m = xy.length;
    [x, y] = bestEnd === 0 ? [xy[m - 2], xy[m - 1]] : [xy[0], xy[1]];
  }
  return travel;
}

function ratioLine(name: string, make: (seed: number) => PlanContour[], seeds: number[]): string {
  const ours: number[] = [], nn: number[] = [], ms: number[] = [];
  for (const seed of seeds) {
    const cs = make(seed);
    const bound = travelLowerBound(cs);
    const t0 = performance.now();
    const r = planContours(cs, ORDER_ONLY);
    ms.push(performance.now() - t0);
    ours.push(r.stats.travelAfter / bound);
    nn.push(nearestNeighbourTravel(cs) / bound);
    consume(r.contours.length);
  }
  return `${name.padEnd(34)} | ${fmt(median(ours), 3).padStart(11)} | ${fmt(median(nn), 3).padStart(9)} | ${fmt(median(nn) / median(ours), 2).padStart(6)}x | ${fmt(median(ms)).padStart(6)}`;
}

/** The printable benchmark block. */
export function benchPlan(): string {
  const lines: string[] = [];
  const seeds = [1, 2, 3];
  lines.push('travel / spanning-tree bound (order only, median of 3 seeds, 300 × 300 mm; a ratio of 1 is unreachable):');
  lines.push(`${'case'.padEnd(34)} | arcspline   | nearest n. | NN/ours | ms`);
  lines.push(ratioLine('10,000 dots (strokes ≤ 0.1 mm)', (s) => randomStrokes(10_000, 0, 0.1, s), seeds));
  lines.push(ratioLine('2,000 strokes of about 2 mm', (s) => randomStrokes(2_000, 1, 3, s), seeds));
  lines.push(ratioLine('2,000 strokes of about 8 mm', (s) => randomStrokes(2_000, 4, 12, s), seeds));

  const drawing = hatchedDrawing(5);
  const r = planContours(drawing, ALL_STEPS);
  const s = r.stats;
  lines.push('');
  lines.push(`generated drawing (${drawing.length.toLocaleString('en')} contours: 40 outlines drawn twice, 45° hatching all drawn one way), all steps:`);
  lines.push(`  travel ${fmt(s.travelBefore)} → ${fmt(s.travelAfter)} mm (${fmt(s.travelBefore / s.travelAfter, 1)}x shorter; bound ${fmt(travelLowerBound(r.contours))} mm over the planned contours), ` +
    `pierces ${s.piercesBefore} → ${s.piercesAfter}, ${s.contoursJoined} joined, ${fmt(s.doubleLength)} mm of double lines removed, ${fmt(s.ms)} ms`);

  const tenK = randomStrokes(10_000, 0, 2, 9);
  const all = timeMedian(() => planContours(tenK, ALL_STEPS), 5);
  const order = timeMedian(() => planContours(tenK, ORDER_ONLY), 5);
  consume(all.result.contours.length + order.result.contours.length);
  lines.push('');
  lines.push(`plan time, 10,000 strokes ≤ 2 mm, median of 5 after a warm-up: all steps ${fmt(all.ms)} ms (order alone ${fmt(order.ms)} ms); ` +
    `travel ${fmt(all.result.stats.travelBefore)} → ${fmt(all.result.stats.travelAfter)} mm`);
  // 100,000 contours in a fresh process, so its peak memory is its own.
  const big = fileURLToPath(new URL('./planBig.ts', import.meta.url));
  lines.push(execFileSync(process.execPath, ['--import', 'tsx', big], { encoding: 'utf8' }).trimEnd());
  return lines.join('\n');
}

/** Travel of the input order, for callers comparing (mm). */
export const inputTravel = (cs: readonly PlanContour[]): number => travelOf(cs);

if (import.meta.url === `file://${process.argv[1]}`) console.log(benchPlan());
