/**
 * Style sheets benchmark (issue 14): a drawing of 10,000 small curved paths
 * whose stroke and fill come from class rules in a `<style>` sheet (four
 * classes, as print-oriented editors write them), against the same drawing
 * with the same paints as presentation attributes (no sheet), in this
 * process: the sheet costs a second parse pass and the selector matching.
 * readSvg alone and the whole refitSvg, medians.
 * Run: npx tsx bench/styles.ts (also part of npm run bench).
 */
import { readSvg } from '../src/svg/document.js';
import { refitSvg } from '../src/refit.js';
import { consume, fmt, median } from './stats.js';

const CLASSES: Readonly<Record<string, string>> = {
  cut: 'fill:none;stroke:#f00;stroke-width:.01px',
  score: 'fill:none;stroke:#0f0;stroke-width:.01px',
  engrave: 'fill:none;stroke:#00f;stroke-width:.01px',
  dark: 'fill:#1a1a1a',
};

/** The drawing: `n` paths of two cubics each on a grid; with class rules or with presentation attributes. */
export function styledDrawing(n: number, sheet: boolean): string {
  const names = Object.keys(CLASSES);
  const side = Math.ceil(Math.sqrt(n));
  const parts: string[] = [];
  for (let i = 0; i < n; i++) {
    const x = (i % side) * 10, y = Math.floor(i / side) * 10;
    const cls = names[i % names.length];
    const paint = sheet
      ? `class="${cls}"`
      : CLASSES[cls].split(';').map((d) => { const [k, v] = d.split(':'); return `${k}="${v}"`; }).join(' ');
    parts.push(`<path ${paint} d="M${x} ${y + 5}C${x + 2} ${y} ${x + 6} ${y} ${x + 8} ${y + 4}S${x + 9} ${y + 9} ${x + 4} ${y + 8}"/>`);
  }
  const style = sheet ? `<defs><style>${Object.entries(CLASSES).map(([k, v]) => `.${k}{${v}}`).join('')}</style></defs>` : '';
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${side * 10}mm" height="${side * 10}mm" viewBox="0 0 ${side * 10} ${side * 10}">${style}<g>${parts.join('')}</g></svg>`;
}

/** Medians of `a` and `b`, run alternately (so that a load change on a shared machine hits both alike) after one warm-up each. */
function timePair(a: () => number, b: () => number, runs: number): [number, number] {
  consume(a());
  consume(b());
  const ta: number[] = [], tb: number[] = [];
  for (let k = 0; k < runs; k++) {
    for (const [f, t] of [[a, ta], [b, tb]] as const) {
      const t0 = performance.now();
      consume(f());
      t.push(performance.now() - t0);
    }
  }
  return [median(ta), median(tb)];
}

export function benchStyles(runs = 7): string {
  const n = 10_000;
  const plain = styledDrawing(n, false), styled = styledDrawing(n, true);
  const [rPlain, rStyled] = timePair(
    () => readSvg(plain, { assumedMmPerUnit: 1 }).elements.length, () => readSvg(styled, { assumedMmPerUnit: 1 }).elements.length, runs);
  const [fPlain, fStyled] = timePair(
    () => refitSvg(plain, { tolerance: 0.05 }).report.totals.rewritten, () => refitSvg(styled, { tolerance: 0.05 }).report.totals.rewritten, 5);
  return [
    `styles: ${n} paths, paint from 4 class rules in a <style> sheet vs the same paint as presentation attributes; medians`,
    `  readSvg: attributes ${fmt(rPlain, 1)} ms, class rules ${fmt(rStyled, 1)} ms (${fmt(rStyled / rPlain, 2)}×; two passes + matching)`,
    `  refitSvg at 0.05 mm: attributes ${fmt(fPlain)} ms, class rules ${fmt(fStyled)} ms (${fmt(fStyled / fPlain, 3)}×)`,
  ].join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(benchStyles());
