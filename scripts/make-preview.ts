/**
 * Writes docs/preview.png: the bundled sample refitted at 0.1 mm, drawn over its
 * original (the picture in the README). Run: npx tsx scripts/make-preview.ts
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { refitSvg } from '../src/refit.js';
import { renderPreview } from '../src/report/preview.js';

const text = readFileSync(new URL('../samples/bracket.svg', import.meta.url), 'utf8');
const r = refitSvg(text, { tolerance: 0.1 });
const png = await renderPreview(text, r.text, { pxPerMm: 8, zoomWorst: true, report: r.report });
writeFileSync(new URL('../docs/preview.png', import.meta.url), png);
console.log(`wrote docs/preview.png (${png.length} bytes)`);
