import { describe, expect, it } from 'vitest';
import { parseCssTransform, parseTransformOrigin } from '../../../src/svg/style/cssTransform.js';

const m = (t: string, w = 200, h = 100): number[] | null => {
  const r = parseCssTransform(t, w, h);
  return r.matrix === null ? null : Array.from(r.matrix).map((v) => +v.toFixed(9) + 0);
};

describe('CSS transform property (CSS Transforms 1 §6–7; units from CSS Values 4 §6: 1in = 96px = 25.4mm)', () => {
  it('lengths carry units: translate(1in, 25.4mm) is 96 px both ways; a bare 0 is allowed', () => {
    expect(m('translate(1in, 25.4mm)')).toEqual([1, 0, 0, 1, 96, 96]);
    expect(m('translate(0, 5px)')).toEqual([1, 0, 0, 1, 0, 5]);
  });

  it('percentages of translate refer to the reference box (the viewport for SVG, transform-box view-box)', () => {
    expect(m('translate(10%, 50%)', 200, 100)).toEqual([1, 0, 0, 1, 20, 50]);
  });

  it('angles carry units: rotate(90deg) = rotate(0.25turn) = rotate(100grad)', () => {
    const r = [0, 1, -1, 0, 0, 0];
    expect(m('rotate(90deg)')).toEqual(r);
    expect(m('rotate(0.25turn)')).toEqual(r);
    expect(m('rotate(100grad)')).toEqual(r);
  });

  it('functions compose left to right as nested groups: translate then scale', () => {
    expect(m('translate(10px, 0) scale(2)')).toEqual([2, 0, 0, 2, 10, 0]);
    expect(m('scaleX(3) scaleY(0.5) translateX(1px) translateY(2px)')).toEqual([3, 0, 0, 0.5, 3, 1]);
  });

  it('the attribute syntax is not CSS: unitless lengths or angles, missing commas, rotate about a point are errors', () => {
    expect(m('translate(10, 20)')).toBeNull();
    expect(m('rotate(45)')).toBeNull();
    expect(m('translate(10px 20px)')).toBeNull();
    expect(m('rotate(45deg, 10px, 10px)')).toBeNull();
    expect(m('translate(1px), scale(2)')).toBeNull();
    expect(parseCssTransform('spin(1deg)', 1, 1).error).toMatch(/invalid spin\(\)/);
  });

  it('none is identity; matrix() takes six numbers', () => {
    expect(m('none')).toEqual([1, 0, 0, 1, 0, 0]);
    expect(m('matrix(1, 2, 3, 4, 5, 6)')).toEqual([1, 2, 3, 4, 5, 6]);
    expect(m('matrix(1, 2, 3, 4, 5px, 6)')).toBeNull();
  });
});

describe('transform-origin (CT1 §8.1; the reference box of an SVG element is its viewport, transform-box view-box)', () => {
  it.each([
    ['10px 20px', [10, 20]], ['50% 25%', [100, 25]], ['center', [100, 50]], ['right bottom', [200, 100]],
    ['top', [100, 0]], ['bottom left', [0, 100]], ['left 10px', [0, 10]], ['1in 0 5px', [96, 0]],
  ] as const)('%s in a 200 × 100 viewport → %j', (text, xy) => {
    expect(parseTransformOrigin(text, 200, 100)).toEqual(xy);
  });

  it('invalid: an angle, top top, four values', () => {
    expect(parseTransformOrigin('10deg', 1, 1)).toBeNull();
    expect(parseTransformOrigin('left right', 1, 1)).toBeNull();
    expect(parseTransformOrigin('1px 2px 3px 4px', 1, 1)).toBeNull();
  });
});
