import { describe, expect, it } from 'vitest';
import { normaliseColour } from '../../../src/svg/style/colour.js';

describe('colours → #rrggbb (CSS Color 4: named colours §6.1, hsl §7, hwb §8; values from memory)', () => {
  it.each([
    ['red', '#ff0000'], ['GREEN', '#008000'], ['#F00', '#ff0000'], ['#00ff00', '#00ff00'], ['rgb(0, 0, 255)', '#0000ff'],
    ['rgb(100%, 0%, 100%)', '#ff00ff'], ['rgb(100%, 50%, 0%)', '#ff8000'], ['rgb(50% 25% 75% / 1)', '#8040bf'], ['hsl(120, 100%, 25%)', '#008000'], ['hsl(0 100% 50%)', '#ff0000'],
    ['hwb(0 0% 0%)', '#ff0000'], ['rgba(255, 0, 0, 0.5)', '#ff000080'], ['transparent', '#00000000'],
  ])('%s → %s', (text, hex) => {
    expect(normaliseColour(text)).toBe(hex);
  });

  it('not a colour → null', () => {
    expect(normaliseColour('blurple')).toBeNull();
    expect(normaliseColour('currentColor')).toBeNull();
  });
});
