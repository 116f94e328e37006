/** The fitter's tests measure with the library's independent check (src/measure/polylineDeviation.ts). */
export { polylineDeviation as deviationOf, polylinePath, segmentsToPathData as writeSegments } from '../../src/measure/polylineDeviation.js';
