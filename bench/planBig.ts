/**
 * 100,000 contours through the whole plan in a process of its own (started by
 * bench/plan.ts), printing time and peak memory; 25,000 and 50,000 first, in
 * fresh processes too, so the growth per contour shows that memory stays bounded
 * (linear in the contours, no n² table).
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { planContours } from '../src/plan/plan.js';
import { randomStrokes } from './planCases.js';
import { ALL_STEPS } from './plan.js';

const n = Number(process.argv[2] ?? 0);
if (n > 0) {
  const cs = randomStrokes(n, 0, 2, 17, 300 * Math.sqrt(n / 10_000));
  const rss0 = process.memoryUsage().rss;
  const t0 = performance.now();
  const r = planContours(cs, ALL_STEPS);
  const ms = performance.now() - t0;
  const peak = process.resourceUsage().maxRSS * 1024;
  console.log(JSON.stringify({ n, ms, peakMB: peak / 2 ** 20, baseMB: rss0 / 2 ** 20, ratio: r.stats.travelBefore / r.stats.travelAfter }));
} else {
  const self = fileURLToPath(import.meta.url);
  const rows = [25_000, 50_000, 100_000].map((k) => JSON.parse(execFileSync(process.execPath, ['--import', 'tsx', self, String(k)], { encoding: 'utf8' })) as { n: number; ms: number; peakMB: number; baseMB: number; ratio: number });
  const out = rows.map((r) => `  ${r.n.toLocaleString('en').padStart(7)} strokes: ${(r.ms / 1000).toFixed(1)} s, peak RSS ${r.peakMB.toFixed(0)} MB (${r.baseMB.toFixed(0)} MB before the plan), travel ${r.ratio.toFixed(1)}x shorter`);
  const per = (rows[2].peakMB - rows[0].peakMB) / (rows[2].n - rows[0].n) * 2 ** 20;
  console.log(`large jobs (strokes ≤ 2 mm, area grown with the count so the density stays that of 10,000 in 300 × 300 mm), one run each in a fresh process:\n${out.join('\n')}\n  growth ${per.toFixed(0)} bytes of peak memory per contour`);
}
