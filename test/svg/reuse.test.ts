/**
 * Reuse (S2 §5.5 symbol, §5.6 use): what a use draws from defs and symbols,
 * the copy factor through a symbol's viewBox and a use's size, every copy's
 * place, and the style a copy inherits from its use.
 */
import { describe, expect, it } from 'vitest';
import { readSvg, type GeometryElement } from '../../src/svg/document.js';
import { refitSvg } from '../../src/refit.js';

const NS = 'xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="200mm" height="200mm" viewBox="0 0 200 200"';
const read = (body: string): GeometryElement[] => readSvg(`<svg ${NS}>${body}</svg>`, { assumedMmPerUnit: 1 }).elements;
const round = (m: Float64Array): number[] => Array.from(m).map((v) => Math.round(v * 1e9) / 1e9 + 0);
/** A dense circle (invented data). */
function ring(cx: number, cy: number, r: number): string {
  const pts: string[] = [];
  for (let i = 0; i < 400; i++) pts.push(`${(cx + r * Math.cos((2 * Math.PI * i) / 400)).toFixed(4)} ${(cy + r * Math.sin((2 * Math.PI * i) / 400)).toFixed(4)}`);
  return `M${pts.join(' L')}Z`;
}

describe('what a use draws from defs and symbols', () => {
  it('geometry in defs or a symbol is rewritable only when a drawn use draws it', () => {
    const els = read('<defs><path id="a" d="M0 0L1 1"/><path id="b" d="M0 0L1 1"/><path id="c" d="M0 0L1 1"/></defs>' +
      '<symbol id="s"><path id="d" d="M0 0L1 1"/></symbol><use href="#a"/><use href="#s"/>' +
      '<g display="none"><use href="#b"/></g><clipPath id="k"><use href="#c"/></clipPath>');
    expect(els.map((e) => [e.id, e.rewritable, e.drawnByUse])).toEqual([
      ['a', true, true], ['b', false, false], ['c', false, false], ['d', true, true],
    ]);
  });

  it('a use inside defs draws only when it is drawn itself (a chain of uses)', () => {
    const els = read('<defs><path id="a" d="M0 0L1 1"/><use id="u1" href="#a"/><use id="u2" href="#u1"/></defs><use href="#u2"/>');
    expect(els[0]).toMatchObject({ rewritable: true, drawnByUse: true });
    expect(read('<defs><path id="a" d="M0 0L1 1"/><use id="u1" href="#a"/></defs>')[0].rewritable).toBe(false);
  });

  it('display:none inside the target keeps it from being drawn; on an ancestor of the target it does not (the copy has its own ancestors)', () => {
    const els = read('<g display="none"><g id="t"><path id="p" d="M0 0L1 1"/><path id="q" display="none" d="M0 0L1 1"/></g></g><use href="#t"/>');
    expect(els.map((e) => [e.id, e.rewritable])).toEqual([['p', true], ['q', false]]);
  });
});

describe('the copy factor through viewports', () => {
  it('a symbol with viewBox 0 0 50 50 drawn by a use 150 wide: 3 (S2 §8.2 viewBox map, xMidYMid meet)', () => {
    const [p] = read('<symbol id="s" viewBox="0 0 50 50"><path id="p" d="M0 0L1 1"/></symbol><use href="#s" width="150" height="150"/>');
    expect(p.copyScale).toBeCloseTo(3, 12);
  });

  it('without width and height the symbol\'s viewport is 100% of the use\'s: 200/50 = 4', () => {
    const [p] = read('<symbol id="s" viewBox="0 0 50 50"><path id="p" d="M0 0L1 1"/></symbol><use href="#s"/>');
    expect(p.copyScale).toBeCloseTo(4, 12);
  });

  it('a symbol\'s own transform (SVG 2) is counted both ways: the larger factor is kept', () => {
    const [p] = read('<symbol id="s" transform="scale(5)"><path id="p" d="M0 0L1 1"/></symbol><use href="#s"/>');
    // Read where it stands with scale(5); copied with it (1) or without it (1/5): 1.
    expect(p.copyScale).toBeCloseTo(1, 12);
    const [q] = read('<symbol id="s" transform="scale(0.5)"><path id="p" d="M0 0L1 1"/></symbol><use href="#s"/>');
    expect(q.copyScale).toBeCloseTo(2, 12);
  });
});

describe('every copy: its place and its style', () => {
  it('each use places a copy; nested uses compose; the symbol viewBox maps it', () => {
    const [p] = read('<defs><g id="g"><path id="p" d="M0 0L1 1"/></g><use id="u" href="#g" x="10"/></defs>' +
      '<use href="#g" transform="scale(2)"/><use href="#u" y="5"/>');
    expect(p.copies.map((c) => round(c.ctm)).sort((a, b) => b[0] - a[0])).toEqual([[2, 0, 0, 2, 0, 0], [1, 0, 0, 1, 10, 5]]);
    const [s] = read('<symbol id="s" viewBox="0 0 10 10"><path id="p" d="M0 0L1 1"/></symbol><use href="#s" x="20" y="30" width="50" height="50"/>');
    expect(s.copies.map((c) => round(c.toMm))).toEqual([[5, 0, 0, 5, 20, 30]]);
  });

  it('a copy through a symbol is clipped to the viewport the use gives it, unless overflow is visible (SVG 2 §5.5, user-agent sheet §16.1)', () => {
    const [p] = read('<symbol id="s" viewBox="0 0 10 10"><path id="p" d="M0 0L1 1"/></symbol><use href="#s" x="20" y="30" width="50" height="40"/>');
    expect(p.copies[0].clips.map((c) => [round(c.toRoot), c.rect])).toEqual([[[1, 0, 0, 1, 20, 30], [0, 0, 50, 40]]]);
    const [q] = read('<symbol id="s" overflow="visible"><path id="p" d="M0 0L1 1"/></symbol><use href="#s"/>');
    expect(q.copies[0].clips).toEqual([]);
  });

  it('a copy inherits from its use, not from where the original stands; rules still match the original (S2 §5.6)', () => {
    const [p] = read('<style>#p{stroke:blue}</style><g fill="red"><defs><path id="p" d="M0 0L1 1"/></defs></g><use href="#p" fill="green"/>');
    expect(p.style.fill).toBe('#ff0000');
    expect(p.copies.map((c) => [c.style.fill, c.style.stroke])).toEqual([['#008000', '#0000ff']]);
  });
});

describe('the refit keeps every copy within the tolerance', () => {
  it('a traced circle in a symbol drawn 4× larger is refitted within tolerance/4 where it stands', () => {
    const tol = 0.1;
    const input = `<svg ${NS}><symbol id="s" viewBox="0 0 50 50"><path id="p" fill="none" stroke="#000" d="${ring(25, 25, 20)}"/></symbol><use href="#s"/></svg>`;
    const r = refitSvg(input, { tolerance: tol });
    const el = r.report.elements.find((e) => e.id === 'p')!;
    expect(el.kept).toBe(false);
    expect(el.deviation!.max).toBeLessThanOrEqual(tol / 4);
  });
});
