/** The benchmark's standard curves, all in mm, sampled uniformly in their parameter. */

export interface Curve {
  name: string;
  xy: Float64Array;
  closed: boolean;
}

function sample(n: number, closed: boolean, f: (t: number) => [number, number]): Float64Array {
  const xy = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const t = closed ? i / n : i / (n - 1);
    const [x, y] = f(t);
    xy[2 * i] = x;
    xy[2 * i + 1] = y;
  }
  return xy;
}

/** Ellipse with semi-axes 60 and 30, 14,000 steps, closed. */
export function ellipse(): Curve {
  return { name: 'ellipse', closed: true, xy: sample(14000, true, (t) => [60 * Math.cos(2 * Math.PI * t), 30 * Math.sin(2 * Math.PI * t)]) };
}

/** y = 20 sin(x/15), x from 0 to 200, 10,000 steps. */
export function sine(): Curve {
  return { name: 'sine', closed: false, xy: sample(10000, false, (t) => [200 * t, 20 * Math.sin((200 * t) / 15)]) };
}

/** Archimedean spiral r = 5 + 3θ, θ from 0 to 6π, 30,000 steps. */
export function spiral(): Curve {
  return {
    name: 'spiral', closed: false,
    xy: sample(30000, false, (t) => {
      const th = 6 * Math.PI * t, r = 5 + 3 * th;
      return [r * Math.cos(th), r * Math.sin(th)];
    }),
  };
}

/** A 1,000,000-point smooth closed curve (a wavy ring about 1.4 m round) for throughput. */
export function bigSmooth(n = 1_000_000): Curve {
  return {
    name: 'smooth-1M', closed: true,
    xy: sample(n, true, (t) => {
      const a = 2 * Math.PI * t, r = 200 + 15 * Math.sin(7 * a) + 6 * Math.cos(17 * a);
      return [r * Math.cos(a), r * Math.sin(a)];
    }),
  };
}
