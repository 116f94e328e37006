/**
 * Writing a preview picture, as a function the CLI calls (e.g. for a
 * `--preview FILE.png` flag): render (src/report/preview.ts) and write the PNG
 * atomically, so a reader never sees half a file.
 */
import { renderPreview, type PreviewOptions } from '../report/preview.js';
import { asUsageError, writeFileAtomic } from './io.js';

/**
 * Render the overlay of `result` over `original` (both whole SVG documents)
 * and write it to `file` as PNG.
 * @returns the number of bytes written
 * @throws UsageError when the file cannot be written (one line, names the file)
 * @throws SvgInputError when either text is not a readable SVG document
 */
export async function writePreview(original: string, result: string, file: string, opts: PreviewOptions = {}): Promise<number> {
  const png = await renderPreview(original, result, opts);
  try {
    await writeFileAtomic(file, png);
  } catch (e) {
    asUsageError(e, 'write', file);
  }
  return png.length;
}
