import { describe, expect, it } from 'vitest';
import { parseSelectorList } from '../../../src/svg/style/selectors.js';
import { STYLE_LIMITS } from '../../../src/svg/style/sheet.js';

const spec = (sel: string): [number, number, number] => {
  const s = parseSelectorList(sel, STYLE_LIMITS)![0].specificity;
  return [s >> 16, (s >> 8) & 255, s & 255];
};

describe('specificity (Selectors 4 §17, the examples there; from memory)', () => {
  it.each([
    ['*', [0, 0, 0]],
    ['li', [0, 0, 1]],
    ['ul li', [0, 0, 2]],
    ['ul ol+li', [0, 0, 3]],
    ['h1 + *[rel=up]', [0, 1, 1]],
    ['ul ol li.red', [0, 1, 3]],
    ['li.red.level', [0, 2, 1]],
    ['#x34y', [1, 0, 0]],
    ['#s12:not(foo)', [1, 0, 1]],
    ['.foo :is(.bar, #baz)', [1, 1, 0]],
    [':where(#a, .b) rect', [0, 0, 1]],
  ] as const)('%s → %j', (sel, want) => {
    expect(spec(sel)).toEqual(want);
  });

  it('an attribute selector on id counts as an attribute, not an id (Selectors 4 §6.7)', () => {
    expect(spec('[id=x]')).toEqual([0, 1, 0]);
  });

  it('an unparsable list gives null (CSS: the whole rule is dropped); pseudo-elements match no element', () => {
    expect(parseSelectorList('rect[', STYLE_LIMITS)).toBeNull();
    expect(parseSelectorList('rect::before', STYLE_LIMITS)).toEqual([]);
  });
});
