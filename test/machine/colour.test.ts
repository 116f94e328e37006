/**
 * Stroke colours as group keys. Values: CSS Color Module Level 3 §4.2 (hex
 * notations, rgb() with integers and percentages) and §4.3 (keywords: red =
 * #ff0000, rebeccapurple is Level 4: #663399); alpha is dropped (CSS Color 4 §5.2 #rgba).
 */
import { describe, expect, it } from 'vitest';
import { strokeKey } from '../../src/machine/colour.js';

describe('strokeKey', () => {
  it.each([
    ['#F00', '#ff0000'], ['#ff0000', '#ff0000'], [' #00FF00 ', '#00ff00'], ['red', '#ff0000'], ['Blue', '#0000ff'],
    ['rgb(255, 0, 0)', '#ff0000'], ['rgb(100%, 50%, 0%)', '#ff8000'], ['rebeccapurple', '#663399'],
    ['#ff000080', '#ff0000'], ['none', 'none'], ['url(#g)', 'none'], ['currentColor', 'none'], ['#12345', 'none'],
  ])('%s → %s', (s, k) => expect(strokeKey(s)).toBe(k));
  it('an unset stroke is none; keys of Object.prototype are not colours', () => {
    expect(strokeKey(null)).toBe('none');
    expect(strokeKey('constructor')).toBe('none');
  });
});
