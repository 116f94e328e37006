/**
 * Affine matrices in SVG order: `[a, b, c, d, e, f]` maps (x, y) to
 * (a·x + c·y + e, b·x + d·y + f), exactly `matrix(a b c d e f)`.
 */
export type Matrix = Float64Array;
