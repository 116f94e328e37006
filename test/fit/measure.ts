/** The fitter's tests measure with the library's independent check (src/report/polylineDeviation.ts). */
export { polylineDeviation as deviationOf, polylinePath, segmentsToPathData as writeSegments } from '../../src/report/polylineDeviation.js';
