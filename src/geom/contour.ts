/**
 * A contour is one subpath flattened to a polyline in machine millimetres.
 *
 * Layout: `xy` holds x0, y0, x1, y1, … (stride 2). A closed contour does not
 * repeat its first vertex at the end. `corners` lists vertex indices (ascending)
 * where the source geometry itself has a tangent break (for example the join of
 * two Bézier segments at an angle); the fitter keeps them as sharp corners in
 * addition to the ones it detects itself.
 */
export interface Contour {
  xy: Float64Array;
  closed: boolean;
  corners?: Uint32Array;
}
