/**
 * Hostile reuse: uses nested so that copies double at every level. The copy
 * factor still bounds every copy (src/svg/copyFactor.ts); the listed copies
 * are capped with a warning, so memory stays bounded.
 */
import { describe, expect, it } from 'vitest';
import { readSvg } from '../../src/svg/document.js';

describe('copies that multiply', () => {
  it('2^14 copies of each of 200 paths: at most 4096 listed per element and 100 000 in all, with a warning', () => {
    let body = `<defs><g id="g0">${'<path d="M0 0L1 1"/>'.repeat(200)}</g>`;
    for (let k = 1; k <= 14; k++) body += `<g id="g${k}"><use href="#g${k - 1}"/><use href="#g${k - 1}" x="1"/></g>`;
    body += '</defs><use href="#g14"/>';
    const doc = readSvg(`<svg xmlns="http://www.w3.org/2000/svg">${body}</svg>`, { assumedMmPerUnit: 1 });
    const counts = doc.elements.map((e) => e.copies.length);
    expect(Math.max(...counts)).toBeLessThanOrEqual(4096);
    expect(counts.reduce((a, b) => a + b, 0)).toBeLessThanOrEqual(100_000);
    expect(doc.elements.every((e) => e.rewritable)).toBe(true);
    expect(doc.warnings.some((w) => /uses draw more copies than are listed/.test(w))).toBe(true);
  });
});
