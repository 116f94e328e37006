import { describe, expect, it } from 'vitest';
import { svgPathProperties } from 'svg-path-properties';
import { PathWriter } from '../../src/write/pathWriter.js';
import { RecordingSink, type PathCommand } from '../../src/write/recorder.js';
import { formatNumber, roundTo } from '../../src/write/numbers.js';
import { parsePathData } from '../../src/svg/pathData.js';
import { OP_A, OP_ARGS, OP_L, OP_M, OP_Z } from '../../src/svg/pathTypes.js';
import type { PathSink } from '../../src/write/sink.js';

function write(digits: number, draw: (s: PathSink) => void): string {
  const w = new PathWriter({ digits });
  draw(w);
  return w.toString();
}

/** Seeded generator (Park–Miller minimal standard, common practice). */
function rng(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

function replay(cmds: readonly PathCommand[], s: PathSink): void {
  for (const c of cmds) {
    if (c.op === 'M') s.moveTo(c.x, c.y);
    else if (c.op === 'L') s.lineTo(c.x, c.y);
    else if (c.op === 'A') s.arcTo(c.rx, c.ry, c.rotation, c.largeArc, c.sweep, c.x, c.y);
    else s.closePath();
  }
}

/** The same commands written the plain way: absolute, every separator, full letters. */
function plain(cmds: readonly PathCommand[], digits: number): string {
  const f = (v: number): string => formatNumber(v, digits);
  return cmds.map((c) => {
    if (c.op === 'M' || c.op === 'L') return `${c.op} ${f(c.x)} ${f(c.y)}`;
    if (c.op === 'A') {
      return `A ${formatNumber(c.rx, digits + 6)} ${formatNumber(c.ry, digits + 6)} ${formatNumber(c.rotation, digits + 6)} ${c.largeArc ? 1 : 0} ${c.sweep ? 1 : 0} ${f(c.x)} ${f(c.y)}`;
    }
    return 'Z';
  }).join(' ');
}

describe('PathWriter: hand-checked strings', () => {
  it('writes H/V for rounded horizontal/vertical moves and Z', () => {
    // H/V = L with one coordinate unchanged (W3C SVG 1.1 §8.3.6, REFERENCES.md §2.4 P13).
    expect(write(2, (s) => { s.moveTo(0, 0); s.lineTo(10, 0.001); s.lineTo(10.004, 10); s.lineTo(0, 0); s.closePath(); }))
      .toBe('M0 0H10V10L0 0Z');
  });

  it('omits separators before "-" and before a second "."', () => {
    // SVG 1.1 §8.3.9 grammar is greedy: "M 100-200" = (100, −200), "M 0.6.5" = (0.6, 0.5) (REFERENCES.md §2.4 P1, P2).
    expect(write(1, (s) => s.moveTo(100, -200))).toBe('M100-200');
    expect(write(1, (s) => s.moveTo(0.6, 0.5))).toBe('M.6.5');
    expect(write(2, (s) => s.moveTo(1.25, 0.5))).toBe('M1.25.5');
    // no '.' in the previous number: "1.5" would be one number, so a space is needed
    expect(write(2, (s) => s.moveTo(1, 0.5))).toBe('M1 .5');
  });

  it('omits repeated command letters, L after M included', () => {
    // After M the implicit command is L; a repeated letter may be omitted (S2 §9.3.1, §9.3.3; REFERENCES.md §2.4 P8, P10).
    expect(write(0, (s) => { s.moveTo(0, 0); s.lineTo(5, 7); s.lineTo(9, 12); s.lineTo(13, 17); }))
      .toBe('M0 0 5 7l4 5 4 5');
    // a second moveto after a moveto must keep its letter (the implied one would be L)
    expect(write(0, (s) => { s.moveTo(0, 0); s.moveTo(5, 7); })).toBe('M0 0M5 7');
  });

  it('writes arcs with single-character flags, shorter form chosen', () => {
    // A rx ry φ fA fS x y; flags are the characters 0/1 (S11 §8.3.9, REFERENCES.md §2.2).
    expect(write(2, (s) => { s.moveTo(0, 0); s.arcTo(5, 5, 0, false, true, 10, 0); })).toBe('M0 0A5 5 0 0 1 10 0');
    // a flag has no '.', so the next '.'-number needs a space; '-' needs none
    expect(write(2, (s) => { s.moveTo(0, 0); s.arcTo(5, 5, 0, false, false, -10, 0); })).toBe('M0 0A5 5 0 0 0-10 0');
    expect(write(2, (s) => { s.moveTo(100, 100); s.arcTo(.5, .5, 0, true, true, 100.5, 100.5); })).toBe('M100 100a.5.5 0 1 1 .5.5');
    // rotation reduced modulo 180° (same ellipse), dropped for equal radii
    expect(write(2, (s) => { s.moveTo(0, 0); s.arcTo(10, 5, 200, false, true, 10, 0); })).toBe('M0 0A10 5 20 0 1 10 0');
    expect(write(2, (s) => { s.moveTo(0, 0); s.arcTo(7, 7, 33, false, true, 10, 0); })).toBe('M0 0A7 7 0 0 1 10 0');
    // repeated arcs share the letter
    expect(write(0, (s) => { s.moveTo(0, 0); s.arcTo(5, 5, 0, false, true, 10, 0); s.arcTo(5, 5, 0, false, true, 0, 0); }))
      .toBe('M0 0A5 5 0 0 1 10 0 5 5 0 0 1 0 0');
  });

  it('resets the current point to the subpath start after Z', () => {
    // After z the current point is the initial point of the subpath (S2 §9.3.4, REFERENCES.md §2.4 P11).
    expect(write(0, (s) => { s.moveTo(10, 10); s.lineTo(20, 10); s.lineTo(20, 20); s.closePath(); s.moveTo(15, 15); }))
      .toBe('M10 10H20V20Zm5 5');
  });
});

describe('PathWriter: read back by independent readers', () => {
  function randomCommands(seed: number, n: number): PathCommand[] {
    const r = rng(seed);
    const cmds: PathCommand[] = [];
    let x = 0, y = 0;
    for (let i = 0; i < n; i++) {
      const k = r();
      const scale = r() < 0.2 ? 1000 : r() < 0.5 ? 10 : 0.3;
      const nx = x + (r() - 0.5) * scale, ny = y + (r() - 0.5) * scale;
      if (i === 0 || k < 0.05) cmds.push({ op: 'M', x: nx, y: ny });
      else if (k < 0.1) cmds.push({ op: 'Z' });
      else if (k < 0.2) cmds.push({ op: 'L', x: nx, y });
      else if (k < 0.6) cmds.push({ op: 'L', x: nx, y: ny });
      else {
        const chord = Math.hypot(nx - x, ny - y) / 2;
        const rr = roundTo(chord * (1.05 + r() * 3), 6); // never too small, so no reader scales it
        cmds.push({ op: 'A', rx: rr, ry: rr, rotation: 0, largeArc: r() < 0.5, sweep: r() < 0.5, x: nx, y: ny });
      }
      if (cmds[cmds.length - 1].op !== 'Z') {
        const c = cmds[cmds.length - 1] as { x: number; y: number };
        x = c.x;
        y = c.y;
      }
    }
    return cmds;
  }

  for (const digits of [0, 2, 4]) {
    it(`matches the plain absolute text in svg-path-properties (digits ${digits})`, () => {
      const cmds = randomCommands(1000 + digits, 400);
      const w = new PathWriter({ digits });
      replay(cmds, w);
      const text = w.toString();
      const ref = plain(cmds, digits);
      expect(text.length).toBeLessThan(ref.length * 0.9);
      // svg-path-properties (npm, general-purpose path reader) as the independent interpreter.
      const a = new svgPathProperties(text), b = new svgPathProperties(ref);
      expect(a.getTotalLength()).toBeCloseTo(b.getTotalLength(), 6);
      const pa = a.getParts(), pb = b.getParts();
      expect(pa.length).toBe(pb.length);
      // The library evaluates arc ends through its own trigonometry (errors ~1e-6 at radii ~4000),
      // so compare to 1e-5: still a tenth of the smallest step written here (1e-4).
      for (let i = 0; i < pa.length; i++) {
        expect(Math.abs(pa[i].end.x - pb[i].end.x)).toBeLessThan(1e-5);
        expect(Math.abs(pa[i].end.y - pb[i].end.y)).toBeLessThan(1e-5);
      }
    });

    it(`round-trips through parsePathData with no drift (digits ${digits})`, () => {
      const cmds = randomCommands(2000 + digits, 400);
      const w = new PathWriter({ digits });
      replay(cmds, w);
      const p = parsePathData(w.toString());
      expect(p.error).toBeNull();
      // Compare absolute values to the rounded inputs. A drawing command right after Z
      // (Z included) makes the parser start a new subpath with an OP_M of its own (pathData.ts header).
      let ai = 0, k = 0, prev = '';
      for (const c of cmds) {
        if (prev === 'Z' && c.op !== 'M' && p.ops[k] === OP_M) {
          k++;
          ai += 2;
        }
        prev = c.op;
        const op = p.ops[k++];
        if (c.op === 'Z') {
          expect(op).toBe(OP_Z);
          continue;
        }
        if (c.op === 'A') {
          expect(op).toBe(OP_A);
          expect(p.args[ai]).toBeCloseTo(c.rx, 9);
          expect(p.args[ai + 3]).toBe(c.largeArc ? 1 : 0);
          expect(p.args[ai + 4]).toBe(c.sweep ? 1 : 0);
        } else expect(op).toBe(c.op === 'M' ? OP_M : OP_L);
        const n = OP_ARGS[op];
        expect(Math.abs(p.args[ai + n - 2] - roundTo(c.x, digits))).toBeLessThan(1e-9);
        expect(Math.abs(p.args[ai + n - 1] - roundTo(c.y, digits))).toBeLessThan(1e-9);
        ai += n;
      }
      expect(k).toBe(p.ops.length);
    });
  }

  it('does not drift over a long run of relative steps', () => {
    const w = new PathWriter({ digits: 1 });
    w.moveTo(0, 0);
    let x = 0;
    for (let i = 0; i < 10000; i++) {
      x += 0.1234;
      w.lineTo(x, i % 2 ? 0.07 : -0.07); // zigzag so it is written as l, never H
    }
    const text = w.toString();
    expect(text).toMatch(/l/);
    const p = parsePathData(text);
    const n = p.args.length;
    expect(Math.abs(p.args[n - 2] - roundTo(x, 1))).toBeLessThan(1e-9);
    const props = new svgPathProperties(text);
    const parts = props.getParts();
    expect(Math.abs(parts[parts.length - 1].end.x - roundTo(x, 1))).toBeLessThan(1e-9);
  });
});

describe('RecordingSink', () => {
  it('records plain objects and flattens them to pathTypes layout', () => {
    const s = new RecordingSink();
    s.moveTo(1, 2);
    s.lineTo(3, 4);
    s.arcTo(5, 6, 7, true, false, 8, 9);
    s.closePath();
    expect(s.commands).toEqual([
      { op: 'M', x: 1, y: 2 },
      { op: 'L', x: 3, y: 4 },
      { op: 'A', rx: 5, ry: 6, rotation: 7, largeArc: true, sweep: false, x: 8, y: 9 },
      { op: 'Z' },
    ]);
    expect(s.count('A')).toBe(1);
    const d = s.toPathData();
    expect(Array.from(d.ops)).toEqual([OP_M, OP_L, OP_A, OP_Z]);
    expect(Array.from(d.args)).toEqual([1, 2, 3, 4, 5, 6, 7, 1, 0, 8, 9]);
  });
});
