/**
 * arcspline's preview picture as its own entry (`import { renderPreview } from
 * 'arcspline/preview'`): a PNG of the result drawn over the original, rendered
 * by sharp. sharp is native code; it loads on the first `renderPreview` call,
 * so neither this entry nor 'arcspline' loads it on import.
 *
 * ```js
 * import { refitSvg } from 'arcspline';
 * import { renderPreview } from 'arcspline/preview';
 *
 * const r = refitSvg(text);
 * const png = await renderPreview(text, r.text, { report: r.report }); // PNG bytes
 * ```
 */

/**
 * `renderPreview(original, result, opts?): Promise<Buffer>` renders the PNG;
 * `buildPreviewSvg` returns the overlay SVG and where things are in it (px),
 * without rendering; `mmToPx` maps a point in mm into that picture.
 */
export { buildPreviewSvg, mmToPx, PREVIEW_COLORS, renderPreview } from './report/preview.js';
export type { PreviewFrame, PreviewOptions, PreviewSvg, WorstSpot } from './report/preview.js';
