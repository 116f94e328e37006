/**
 * CSS colour values → `#rrggbb` (or `#rrggbbaa` when not opaque), for paint
 * normalisation. color-string (npm) parses the text; this module only turns
 * its hsl and hwb triples into rgb (CSS Color 4 §7.1 and §8.1 conversion
 * formulas) and writes hex.
 */
import colorString from 'color-string';

/** CSS Color 4 §7.1: hsl (degrees, %, %) → rgb 0..255. */
function hslToRgb(h: number, s: number, l: number): [number, number, number] {
  s /= 100;
  l /= 100;
  const f = (n: number): number => {
    const k = (n + h / 30) % 12;
    const a = s * Math.min(l, 1 - l);
    return 255 * (l - a * Math.max(-1, Math.min(k - 3, 9 - k, 1)));
  };
  return [f(0), f(8), f(4)];
}

/** CSS Color 4 §8.1: hwb (degrees, %, %) → rgb 0..255. */
function hwbToRgb(h: number, w: number, b: number): [number, number, number] {
  w /= 100;
  b /= 100;
  if (w + b >= 1) {
    const g = (255 * w) / (w + b);
    return [g, g, g];
  }
  return hslToRgb(h, 100, 50).map((c) => c * (1 - w - b) + 255 * w) as [number, number, number];
}

const hex2 = (v: number): string => Math.max(0, Math.min(255, Math.round(v))).toString(16).padStart(2, '0');

/**
 * color-string scales a percentage channel by 2.55 (50 % → 127.49999… → 127); CSS Color 4 §5.1 maps
 * 0–100 % onto 0–255 (50 % → 127.5, serialised 128 as browsers do). Recompute percentage channels
 * from the numbers color-string accepted, so `rgb(100%, 50%, 0%)` and `#ff8000` are one colour.
 */
function percentChannels(text: string, rgb: number[]): number[] {
  if (text.indexOf('%') < 0) return rgb;
  const nums = text.match(/[-+]?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?%?/gi) ?? [];
  return rgb.map((v, i) => (nums[i]?.endsWith('%') ? (parseFloat(nums[i]) * 255) / 100 : v));
}

/**
 * A CSS colour as lower-case `#rrggbb`, `#rrggbbaa` when its alpha is below
 * 1, or null when it is not a colour (`currentColor` is the caller's).
 */
export function normaliseColour(text: string): string | null {
  const c = colorString.get(text.trim());
  if (c === null) return null;
  const [x, y, z, alpha] = c.value;
  const rgb = c.model === 'rgb' ? percentChannels(text, [x, y, z]) : c.model === 'hsl' ? hslToRgb(x, y, z) : hwbToRgb(x, y, z);
  const a = alpha ?? 1;
  return `#${hex2(rgb[0])}${hex2(rgb[1])}${hex2(rgb[2])}${a < 1 ? hex2(a * 255) : ''}`;
}
