/**
 * Real-data benchmark (issue 10): per class of real drawings (test/realdata),
 * arcspline's pieces against lines-only Ramer–Douglas–Peucker (simplify-js,
 * high-quality mode) at 0.02 / 0.05 / 0.1 mm, and the elements reverted.
 *
 * Counting, the same on both sides: every drawn segment is one piece, and a
 * closing `Z` that draws a line (its current point is not the subpath start)
 * counts as one line. arcspline's count is read off its written document (a
 * kept element counts as written); RDP's from the input flattened within 5 %
 * of the tolerance (the share the refit gives flattening) and thinned within
 * the remaining 95 %, a closed contour with its start repeated at the end.
 * ratio = RDP lines / arcspline pieces: sum over the class, and the geometric
 * mean of the per-drawing ratios.
 * Run: npm run bench (all benchmarks) or npx tsx bench/realdata.ts.
 */
import simplify from 'simplify-js';
import { refitSvg } from '../src/refit.js';
import { readSvg } from '../src/svg/document.js';
import { flattenPath } from '../src/geom/flatten.js';
import { realCorpus, type RealClass } from '../test/realdata/corpus.js';
import { fmt } from './stats.js';
import { drawnPieces, readGeometry } from '../src/model/fromSvg.js';

const TOLERANCES = [0.02, 0.05, 0.1];
const READ = { assumedMmPerUnit: 1 };

/** Pieces drawn by every rewritable element of a document. */
function documentPieces(svg: string): number {
  let n = 0;
  for (const el of readSvg(svg, READ).elements) {
    const p = el.rewritable ? readGeometry(el, []) : null;
    if (p) n += drawnPieces(p);
  }
  return n;
}

/** RDP lines for every rewritable element of a document at tolerance tol (mm). */
function rdpLines(svg: string, tol: number): number {
  let n = 0;
  for (const el of readSvg(svg, READ).elements) {
    const p = el.rewritable ? readGeometry(el, []) : null;
    if (!p) continue;
    for (const c of flattenPath(p, el.toMm, 0.05 * tol)) {
      const pts: { x: number; y: number }[] = [];
      for (let i = 0; i < c.xy.length; i += 2) pts.push({ x: c.xy[i], y: c.xy[i + 1] });
      if (c.closed) pts.push(pts[0]);
      n += simplify(pts, 0.95 * tol, true).length - 1;
    }
  }
  return n;
}

export interface ClassFigures {
  cls: RealClass;
  tol: number;
  pieces: number;
  rdp: number;
  sumRatio: number;
  geoRatio: number;
  reverted: number;
  elements: number;
  worstDev: number;
}

/** The figures per class and tolerance. */
export function realFigures(tolerances = TOLERANCES): ClassFigures[] {
  const corpus = realCorpus();
  const out: ClassFigures[] = [];
  for (const tol of tolerances) {
    const byClass = new Map<RealClass, ClassFigures & { logs: number[] }>();
    for (const d of corpus) {
      const res = refitSvg(d.svg, { tolerance: tol, shapesAsPaths: true, assumedMmPerUnit: 1 });
      const pieces = documentPieces(res.text), rdp = rdpLines(d.svg, tol);
      const f = byClass.get(d.cls) ?? { cls: d.cls, tol, pieces: 0, rdp: 0, sumRatio: 0, geoRatio: 0, reverted: 0, elements: 0, worstDev: 0, logs: [] };
      f.pieces += pieces;
      f.rdp += rdp;
      f.logs.push(Math.log(rdp / pieces));
      for (const e of res.report.elements) {
        f.elements++;
        if (e.keptReason?.startsWith('measured deviation')) f.reverted++;
        if (!e.kept && e.deviation && e.deviation.max > f.worstDev) f.worstDev = e.deviation.max;
      }
      byClass.set(d.cls, f);
    }
    for (const f of byClass.values()) {
      f.sumRatio = f.rdp / f.pieces;
      f.geoRatio = Math.exp(f.logs.reduce((a, b) => a + b, 0) / f.logs.length);
      const { logs: _, ...rest } = f;
      out.push(rest);
    }
  }
  return out;
}

/** The printable benchmark block. */
export function benchRealData(): string {
  const lines = ['real drawings (test/realdata): arcspline pieces vs simplify-js RDP lines, Z closing lines counted on both sides'];
  lines.push('class          tol mm | arcspline pieces  RDP lines | ratio sum  ratio geomean | reverted / elements  worst dev mm');
  for (const f of realFigures()) {
    lines.push(
      `${f.cls.padEnd(14)} ${fmt(f.tol, 2).padStart(6)} | ${String(f.pieces).padStart(16)}  ${String(f.rdp).padStart(9)} | ` +
        `${fmt(f.sumRatio, 2).padStart(9)}  ${fmt(f.geoRatio, 2).padStart(13)} | ${`${f.reverted} / ${f.elements}`.padStart(19)}  ${fmt(f.worstDev, 4).padStart(12)}`,
    );
  }
  return lines.join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(benchRealData());
