/**
 * The cascade as SVG 2 §6 applies it, through readSvg. Each case names the
 * rule it checks (SVG 2 §6.4 presentation attributes; CSS Cascade 4 §6.1
 * importance and origin, §6.4 specificity and order, §7 inherit/initial/unset;
 * CSS Display 3 §2.5 display none; SVG 2 §13.3 visibility).
 */
import { describe, expect, it } from 'vitest';
import { readSvg, type GeometryElement } from '../../../src/svg/document.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const read = (body: string): GeometryElement[] => readSvg(`<svg ${NS} viewBox="0 0 100 100">${body}</svg>`, { assumedMmPerUnit: 1 }).elements;
const fillOf = (body: string, id = 'r'): string => read(body).find((e) => e.id === id)!.style.fill;

describe('cascade order', () => {
  it('a presentation attribute loses to any sheet rule, even *  (SVG 2 §6.4: specificity 0, before all sheets)', () => {
    expect(fillOf('<style>*{fill:green}</style><rect id="r" fill="red"/>')).toBe('#008000');
  });

  it('higher specificity wins, then the later rule', () => {
    expect(fillOf('<style>#r{fill:green} rect.a{fill:red}</style><rect id="r" class="a"/>')).toBe('#008000');
    expect(fillOf('<style>.a{fill:red} .a{fill:green}</style><rect id="r" class="a"/>')).toBe('#008000');
  });

  it('the style attribute beats every rule; !important in a sheet beats it; !important in it beats that', () => {
    expect(fillOf('<style>#r{fill:red}</style><rect id="r" style="fill:green"/>')).toBe('#008000');
    expect(fillOf('<style>rect{fill:green !important}</style><rect id="r" style="fill:red"/>')).toBe('#008000');
    expect(fillOf('<style>#r{fill:red !important}</style><rect id="r" style="fill:green !important"/>')).toBe('#008000');
  });

  it('an invalid value is dropped and the next lower declaration applies (CSS Syntax 3 §8; SVG 2 §6.7)', () => {
    expect(fillOf('<style>#r{fill:green} #r{fill:nonsense}</style><rect id="r"/>')).toBe('#008000');
    expect(fillOf('<rect id="r" fill="green" style="fill: 12px"/>')).toBe('#008000');
  });

  it('a sheet after the element and sheets in CDATA apply; a <style> of another type does not', () => {
    expect(fillOf('<rect id="r" class="a"/><style>.a{fill:green}</style>')).toBe('#008000');
    expect(fillOf('<style><![CDATA[ .a > rect { fill: green } ]]></style><g class="a"><rect id="r"/></g>')).toBe('#008000');
    expect(fillOf('<style type="text/x-other">.a{fill:red}</style><rect id="r" class="a" fill="green"/>')).toBe('#008000');
  });

  it('sibling and structural selectors see the whole document (the table of the first pass)', () => {
    const els = read('<style>rect + rect{fill:green} rect:last-child{stroke:blue}</style><g><rect id="a"/><rect id="b"/></g>');
    expect(els.map((e) => [e.id, e.style.fill, e.style.stroke])).toEqual([['a', '#000000', 'none'], ['b', '#008000', '#0000ff']]);
  });
});

describe('inheritance and the CSS-wide keywords', () => {
  it('fill, stroke, stroke-width inherit; initial values are black, none, 1 (SVG 2 §13.2, §13.5)', () => {
    const [r] = read('<g fill="green" stroke="#00f" stroke-width="3"><rect id="r"/></g>');
    expect(r.style).toMatchObject({ fill: '#008000', stroke: '#0000ff', strokeWidth: 3 });
    const [s] = read('<g fill="green"><rect id="r" fill="initial" stroke="inherit"/></g>');
    expect(s.style).toMatchObject({ fill: '#000000', stroke: 'none', strokeWidth: 1 });
  });

  it('inherit takes the parent\'s value even for a property that does not inherit (transform)', () => {
    const [r] = read('<style>g{transform:translate(5px, 0)} rect{transform:inherit}</style><g><rect id="r"/></g>');
    expect(Array.from(r.ctm)).toEqual([1, 0, 0, 1, 10, 0]);
  });

  it('currentColor paints with the element\'s own color (CSS Color 4 §6.4)', () => {
    expect(fillOf('<g color="red"><rect id="r" color="green" fill="currentColor"/></g>')).toBe('#008000');
  });

  it('stroke-width units and percentages (of the normalised diagonal, SVG 2 §8.9); mm on the machine', () => {
    const [a, b] = read('<rect id="a" stroke-width="1mm"/><rect id="b" style="stroke-width:10%"/>');
    expect(a.style.strokeWidth).toBeCloseTo(96 / 25.4, 12);
    expect(a.style.strokeWidthMm).toBeCloseTo((96 / 25.4) * 1, 12);
    expect(b.style.strokeWidth).toBeCloseTo(10, 12);
  });
});

describe('what is drawn', () => {
  it('display:none from a class rule leaves the element (and what is inside) as written, with the reason', () => {
    const els = read('<style>.off{display:none}</style><g class="off"><path id="p" d="M0 0L1 1"/></g><path id="q" class="off" d="M0 0L1 1"/>');
    expect(els.map((e) => [e.rewritable, e.reason])).toEqual([[false, 'display: none on <g>'], [false, 'display: none on <path#q>']]);
  });

  it('visibility:hidden is not painted (kept, with the reason); a child may be visible again (SVG 2 §13.3)', () => {
    const els = read('<g visibility="hidden"><path id="a" d="M0 0L1 1"/><path id="b" visibility="visible" d="M0 0L1 1"/></g>');
    expect(els.map((e) => [e.id, e.reason])).toEqual([['a', 'visibility: hidden on <path#a> (not painted)'], ['b', null]]);
  });

  it('a CSS transform in a sheet or the style attribute is part of the matrix, and overrides the attribute', () => {
    const [a, b] = read('<style>#a{transform:scale(2)}</style><rect id="a" transform="translate(50 0)"/><rect id="b" style="transform: rotate(90deg)"/>');
    expect(Array.from(a.ctm)).toEqual([2, 0, 0, 2, 0, 0]);
    expect(Array.from(b.ctm).map((v) => Math.round(v * 1e12) / 1e12 + 0)).toEqual([0, 1, -1, 0, 0, 0]);
  });

  it('transform-origin moves the fixed point of the transform: rotate(90deg) about (10, 0) sends (10, 0) to itself (CT1 §8.1)', () => {
    const [a] = read('<rect id="a" style="transform: rotate(90deg); transform-origin: 10px 0"/>');
    // translate(10 0) · rotate(90) · translate(−10 0) = [0 1 −1 0 10 −10].
    expect(Array.from(a.ctm).map((v) => Math.round(v * 1e12) / 1e12 + 0)).toEqual([0, 1, -1, 0, 10, -10]);
  });

  it('an invalid CSS transform is dropped with a warning; the attribute then applies', () => {
    const doc = readSvg(`<svg ${NS}><rect id="a" transform="translate(3 0)" style="transform: rotate(45)"/></svg>`, { assumedMmPerUnit: 1 });
    expect(Array.from(doc.elements[0].ctm)).toEqual([1, 0, 0, 1, 3, 0]);
    expect(doc.warnings.some((w) => /CSS transform ignored: invalid rotate\(\)/.test(w))).toBe(true);
  });
});
