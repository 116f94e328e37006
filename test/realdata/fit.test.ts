/**
 * The fitter on real map data (Natural Earth through world-atlas; see
 * ./README.md): every contour comes back drawn (no contour vanishes), within
 * its own tolerance by the independent measurement
 * (src/measure/polylineDeviation.ts), and with no more pieces than a lines-only
 * thinning (src/fit/prefilter.ts) at that tolerance.
 */
import { describe, expect, it } from 'vitest';
import { realCorpus } from './corpus.js';
import { readSvg } from '../../src/svg/document.js';
import { parsePathData } from '../../src/svg/pathData.js';
import { flattenPath } from '../../src/geom/flatten.js';
import { fitPolyline, LINES_SHARE } from '../../src/fit/fitPolyline.js';
import { thinWithin } from '../../src/fit/prefilter.js';
import { polylineDeviation } from '../../src/measure/polylineDeviation.js';

describe('real map contours', () => {
  const maps = realCorpus().filter((d) => d.cls === 'maps');
  for (const tol of [0.018, 0.045]) {
    it(`every contour of ${maps.length} map drawings is drawn within ${tol} mm, no worse than lines`, () => {
      let contours = 0;
      for (const d of maps) {
        for (const el of readSvg(d.svg, { assumedMmPerUnit: 1 }).elements) {
          for (const c of flattenPath(parsePathData(el.attrs.d ?? ''), el.toMm, tol)) {
            contours++;
            const what = `${d.name}, ${el.id}, contour of ${c.xy.length >> 1} vertices`;
            const r = fitPolyline(c.xy, { tolerance: tol, closed: c.closed, corners: c.corners });
            expect(r.segments.length, what).toBeGreaterThan(0);
            expect(polylineDeviation(c.xy, c.closed, r.segments, tol).max, what).toBeLessThanOrEqual(tol);
            expect(r.segments.length, what).toBeLessThanOrEqual(thinWithin(c.xy, c.xy.length >> 1, c.closed, LINES_SHARE * tol, null).length - 1);
          }
        }
      }
      expect(contours).toBeGreaterThan(1000);
    });
  }
});
