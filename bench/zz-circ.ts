import { fitPolyline } from '../src/fit/fitPolyline.js';
import { arcGeometry } from '../src/fit/segment.js';
import { circle } from '../test/fit/shapes.js';
for (const tol of [0.01, 0.05, 0.1]) for (const [r, n] of [[20, 360], [2, 64], [2, 36], [50, 100], [5, 720]]) {
  const xy = circle(70, 25, r, n).map((v, i) => v);
  const f = fitPolyline(xy, { tolerance: tol, closed: true });
  const sag = r * (1 - Math.cos(Math.PI / n));
  console.log(`tol ${tol} r ${r} n ${n} sag ${sag.toFixed(4)}: ${f.segments.length} ${f.choice} start (${f.segments[0].x0.toFixed(3)},${f.segments[0].y0.toFixed(3)}) ` + f.segments.map((s) => { const g = arcGeometry(s); return g ? `r ${g.r.toFixed(4)} c ${g.cx.toFixed(4)},${g.cy.toFixed(4)} sw ${(g.sweep * 57.3).toFixed(0)}` : 'line'; }).join(' | '));
}
