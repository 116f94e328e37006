import { describe, expect, it } from 'vitest';
import { svgPathProperties } from 'svg-path-properties';
import { parsePathData, pathDataToString } from '../../src/svg/pathData.js';
import { OP_A, OP_C, OP_L, OP_M, OP_Q, OP_Z } from '../../src/svg/pathTypes.js';

/** Absolute serialisation of what was parsed, and the error (if any). */
function abs(d: string): string {
  return pathDataToString(parsePathData(d));
}
function clean(d: string): string {
  const p = parsePathData(d);
  expect(p.error, d).toBeNull();
  return pathDataToString(p);
}

describe('path data check values (REFERENCES.md §2.4)', () => {
  it('P1 "M 100-200" → M(100,−200)', () => {
    // W3C SVG 2 §9.3.9 text (greedy tokenising)
    expect(clean('M 100-200')).toBe('M 100 -200');
  });
  it('P2 "M 0.6.5" → M(0.6,0.5)', () => {
    // W3C SVG 2 §9.3.9 text
    expect(clean('M 0.6.5')).toBe('M 0.6 0.5');
  });
  it('P3 "M.5.5" / "M-.5-.5"', () => {
    // SVG 2 §9.3.9 grammar
    expect(clean('M.5.5')).toBe('M 0.5 0.5');
    expect(clean('M-.5-.5')).toBe('M -0.5 -0.5');
  });
  it('P4 exponents "M1e2-1e1", "M1E+2 0"', () => {
    // SVG 2 §9.3.9 grammar (exponent)
    expect(clean('M1e2-1e1')).toBe('M 100 -10');
    expect(clean('M1E+2 0')).toBe('M 100 0');
  });
  it('P5 "M 10,10 L 20,20,30" keeps the complete segment, then errors', () => {
    // W3C SVG 1.1 F.5, SVG 2 §9.5.4 example
    const p = parsePathData('M 10,10 L 20,20,30');
    expect(pathDataToString(p)).toBe('M 10 10 L 20 20');
    expect(p.error).not.toBeNull();
    expect(p.error!.offset).toBe(18);
  });
  it('P6 "m 0 0 l -9 11 -123 z": z not drawn', () => {
    // WPT svg/path/error-handling/render-until-error.svg
    const p = parsePathData('m 0 0 l -9 11 -123 z');
    expect(pathDataToString(p)).toBe('M 0 0 L -9 11');
    expect(p.error!.offset).toBe(19);
  });
  it('P7 "m 0 0 l 3 -4 z # ignored suffix v 123": closed, rest ignored', () => {
    // WPT svg/path/error-handling/render-until-error.svg
    const p = parsePathData('m 0 0 l 3 -4 z # ignored suffix v 123');
    expect(pathDataToString(p)).toBe('M 0 0 L 3 -4 Z');
    expect(p.error!.offset).toBe(15);
    expect(p.error!.message).toMatch(/"#"/);
  });
  it('P8 implicit repeated L', () => {
    // W3C SVG 2 §9.3.1
    expect(clean('M 100 200 L 200 100 -100 -200')).toBe('M 100 200 L 200 100 L -100 -200');
  });
  it('P9 "m10 10 20 20" → M(10,10) L(30,30)', () => {
    // W3C SVG 2 §9.3.3: extra pairs after m are relative l
    expect(clean('m10 10 20 20')).toBe('M 10 10 L 30 30');
  });
  it('P10 "M10 10 20 20" → M(10,10) L(20,20)', () => {
    // W3C SVG 2 §9.3.3
    expect(clean('M10 10 20 20')).toBe('M 10 10 L 20 20');
  });
  it('P11 "M10 10 h10 v10 z m5 5": after z the current point is the start', () => {
    // W3C SVG 2 §9.3.4
    expect(clean('M10 10 h10 v10 z m5 5')).toBe('M 10 10 L 20 10 L 20 20 Z M 15 15');
  });
  it('P12 "M10 10 h10 v10 z l5 5": a new subpath starts at (10,10)', () => {
    // W3C SVG 2 §9.3.4
    expect(clean('M10 10 h10 v10 z l5 5')).toBe('M 10 10 L 20 10 L 20 20 Z M 10 10 L 15 15');
  });
  it('P13 "M0 0 H10 V10 h-5 v-5"', () => {
    // W3C SVG 2 §9.3.5
    expect(clean('M0 0 H10 V10 h-5 v-5')).toBe('M 0 0 L 10 0 L 10 10 L 5 10 L 5 5');
  });
  it('P14 S after C reflects cp2: cp1 = (40,−10)', () => {
    // W3C SVG 2 §9.5.2
    expect(clean('M0 0 C10 10 20 10 30 0 S50 -10 60 0')).toBe('M 0 0 C 10 10 20 10 30 0 C 40 -10 50 -10 60 0');
  });
  it('P15 S after L: cp1 = current point (10,0)', () => {
    // W3C SVG 2 §9.3.6
    expect(clean('M0 0 L10 0 S20 10 30 0')).toBe('M 0 0 L 10 0 C 10 0 20 10 30 0');
  });
  it('P16 T after Q and after T: cps (30,−10) then (50,10)', () => {
    // W3C SVG 2 §9.3.7, §9.5.2
    expect(clean('M0 0 Q10 10 20 0 T40 0 T60 0')).toBe('M 0 0 Q 10 10 20 0 Q 30 -10 40 0 Q 50 10 60 0');
  });
  it('P17 compact flags "a25 25 0 1025 25"', () => {
    // W3C SVG 2 §9.3.9 flag rule
    expect(clean('M0 0 a25 25 0 1025 25')).toBe('M 0 0 A 25 25 0 1 0 25 25');
  });
  it('P18 "a1 1 0 00 1 1" → fA0 fS0 → (1,1)', () => {
    // W3C SVG 2 §9.3.9
    expect(clean('M0 0 a1 1 0 00 1 1')).toBe('M 0 0 A 1 1 0 0 0 1 1');
  });
  it('P19 flag "2" is a syntax error: only M kept', () => {
    // SVG 2 §9.3.9 grammar flag ::= 0|1
    const p = parsePathData('M0 0 a1 1 0 2 0 1 1');
    expect(pathDataToString(p)).toBe('M 0 0');
    expect(p.error!.offset).toBe(12);
    expect(p.error!.message).toMatch(/flag/);
  });
  it('P20 "L10 10": no initial moveto → nothing, error at 0', () => {
    // W3C SVG 2 §9.3.3
    const p = parsePathData('L10 10');
    expect(p.ops.length).toBe(0);
    expect(p.error!.offset).toBe(0);
  });
  it('P21 "M 13,000.56 0": greedy reads 13, 0.56 then an incomplete pair', () => {
    // W3C SVG 2 §9.3.1, §9.3.9 (REFERENCES.md §2.4 P21)
    const p = parsePathData('M 13,000.56 0');
    expect(pathDataToString(p)).toBe('M 13 0.56');
    expect(p.error!.offset).toBe(13);
  });
});

describe('arc syntax (REFERENCES.md §1.4 inputs read as written)', () => {
  it('A1–A9 inputs parse to OP_A with the values written', () => {
    // S11 F.6 / S2 §9.3.8: radii as written (negatives accepted, SVG 2 `number`), correction is later
    const cases: Array<[string, string]> = [
      ['M0 0 A1 1 0 0 1 2 0', 'M 0 0 A 1 1 0 0 1 2 0'], // A1
      ['M0 0 A1 1 0 0 0 2 0', 'M 0 0 A 1 1 0 0 0 2 0'], // A2
      ['M0 0 A1 1 0 0 1 4 0', 'M 0 0 A 1 1 0 0 1 4 0'], // A3
      ['M0 0 A-5 -5 0 0 1 10 0', 'M 0 0 A -5 -5 0 0 1 10 0'], // A4
      ['M0 0 A0 5 0 0 1 10 0', 'M 0 0 A 0 5 0 0 1 10 0'], // A5
      ['M125 75 A100 50 0 0 0 225 125', 'M 125 75 A 100 50 0 0 0 225 125'], // A6a
      ['M125,75 a100,50 0 1,1 100,50', 'M 125 75 A 100 50 0 1 1 225 125'], // A6d relative form
      ['M0 0 A50 25 30 1 0 60 40', 'M 0 0 A 50 25 30 1 0 60 40'], // A7
      ['M5 5 A10 10 0 1 1 5 5', 'M 5 5 A 10 10 0 1 1 5 5'], // A8 kept; omission is the arc stage's job
      ['M0 0 A10 10 0 1 1 0 1e-9', 'M 0 0 A 10 10 0 1 1 0 1e-9'], // A9
    ];
    for (const [d, want] of cases) expect(clean(d), d).toBe(want);
  });
  it('flags with commas and no separators, repeated arcs', () => {
    expect(clean('M0 0a1,1,0,1,0,2,2')).toBe('M 0 0 A 1 1 0 1 0 2 2');
    expect(clean('M0 0a1 1 0 0 1 1 1 1 1 0 0 1 1 1')).toBe('M 0 0 A 1 1 0 0 1 1 1 A 1 1 0 0 1 2 2');
    expect(clean('M0 0A1 1 0 11-1-1')).toBe('M 0 0 A 1 1 0 1 1 -1 -1');
  });
  it('rx/ry and rotation are never made relative', () => {
    const p = parsePathData('M10 20 a3 4 5 0 1 1 1');
    expect(p.ops[1]).toBe(OP_A);
    expect(Array.from(p.args.subarray(2))).toEqual([3, 4, 5, 0, 1, 11, 21]);
  });
});

describe('semantics and grammar details', () => {
  it('relative c/s/q/t control points are relative to the segment start', () => {
    // W3C SVG 2 §9.3.6–9.3.7
    expect(clean('M10 10 c1 1 2 2 3 3 s1 1 2 2')).toBe('M 10 10 C 11 11 12 12 13 13 C 14 14 14 14 15 15');
    expect(clean('M10 10 q1 1 2 0 t2 0')).toBe('M 10 10 Q 11 11 12 10 Q 13 9 14 10');
  });
  it('T after a non-quadratic uses the current point; S after Q too', () => {
    // W3C SVG 2 §9.5.2: only C/S reflect for S, only Q/T for T
    expect(clean('M0 0 C1 1 2 1 3 0 T5 0')).toBe('M 0 0 C 1 1 2 1 3 0 Q 3 0 5 0');
    expect(clean('M0 0 Q1 1 2 0 S4 1 5 0')).toBe('M 0 0 Q 1 1 2 0 C 2 0 4 1 5 0');
  });
  it('reflection does not survive Z or M', () => {
    expect(clean('M0 0 C1 1 2 1 3 0 Z S1 1 2 2')).toBe('M 0 0 C 1 1 2 1 3 0 Z M 0 0 C 0 0 1 1 2 2');
  });
  it('first m is absolute, Z Z and Z then M', () => {
    // W3C SVG 2 §9.3.3
    expect(clean('m5 5 z')).toBe('M 5 5 Z');
    expect(clean('M1 1 L2 2 Z Z')).toBe('M 1 1 L 2 2 Z M 1 1 Z');
    expect(clean('M1 1 L2 2 z M3 3 L4 4')).toBe('M 1 1 L 2 2 Z M 3 3 L 4 4');
    expect(clean('M1 1 L2 2 z m1 1')).toBe('M 1 1 L 2 2 Z M 2 2');
  });
  it('opcodes, args and counts per letter as written', () => {
    const p = parsePathData('M0 0 10 0 c1 1 2 2 3 3 4 4 5 5 6 6 s1 1 2 2 Q1 1 2 2 t1 1 h1 V2 a1 1 0 0 0 1 1 z l1 1');
    expect(p.error).toBeNull();
    expect(Array.from(p.ops)).toEqual([OP_M, OP_L, OP_C, OP_C, OP_C, OP_Q, OP_Q, OP_L, OP_L, OP_A, OP_Z, OP_M, OP_L]);
    expect(p.counts).toEqual({ M: 2, c: 2, s: 1, Q: 1, t: 1, h: 1, V: 1, a: 1, z: 1, l: 1 });
    expect(p.args.length).toBe(2 + 2 + 6 * 3 + 4 * 2 + 2 * 2 + 7 + 2 + 2);
  });
  it('trailing-dot numbers are accepted on read', () => {
    // S2 §9.3.9 note (REFERENCES.md §2.2): accept on read
    expect(clean('M23. 5.')).toBe('M 23 5');
    expect(clean('M1..5')).toBe('M 1 0.5');
  });
  it('whitespace of every kind, empty and none', () => {
    expect(clean('\t\n\f\rM\t1\n2\r')).toBe('M 1 2');
    const empty = parsePathData('   ');
    expect(empty.ops.length).toBe(0);
    expect(empty.error).toBeNull();
    expect(parsePathData('none').error).toBeNull();
  });
  it('errors: stray characters, commas before commands, junk numbers', () => {
    const bad: Array<[string, string, number]> = [
      ['M0 0 L1 1, L2 2', 'M 0 0 L 1 1', 11],
      ['M0 0 L1 1,', 'M 0 0 L 1 1', 10],
      ['M0 0 Z 1 1', 'M 0 0 Z', 7],
      ['M0 0 L1 1 X2 2', 'M 0 0 L 1 1', 10],
      ['M0,,0', '', 3],
      ['M,0 0', '', 1],
      ['M0 0 L 1e400 0', 'M 0 0', 7],
      ['M0 0 L1 1e', 'M 0 0 L 1 1', 9], // greedy: "1" is the number, "e" is stray
      ['M0 0 C1 1 2 2', 'M 0 0', 13],
      ['M0 0 L1 1 \u00e9', 'M 0 0 L 1 1', 10],
      ['M0 0 A1 1 0 0', 'M 0 0', 13],
    ];
    for (const [d, kept, offset] of bad) {
      const p = parsePathData(d);
      expect(pathDataToString(p), d).toBe(kept);
      expect(p.error, d).not.toBeNull();
      expect(p.error!.offset, d).toBe(offset);
    }
  });
  it('does not modify its view of counts for the OP_M inserted after Z', () => {
    expect(parsePathData('M0 0 L1 0 Z L2 2').counts).toEqual({ M: 1, L: 2, Z: 1 });
  });
});

describe('round trip against svg-path-properties (general-purpose npm library)', () => {
  // svg-path-properties measures the original string with its own parser; our absolute
  // re-serialisation must describe the same geometry, so the total lengths agree.
  const paths = [
    'M10 10 L 50 50 l 10 -20 H 100 h -5 V 80 v 5 Z',
    'm 5 5 c 10 0 20 10 20 20 s 10 20 20 20 S 80 80 90 60 C 100 50 110 50 120 60',
    'M0 0 Q 20 40 40 0 T 80 0 t 40 0 q 10 10 20 0 t 20 0',
    'M10 80 A 45 45 0 0 0 125 125 a 30 50 -45 1 1 50 -25 A 20 10 30 0 1 220 40',
    'M 0 0 L 10 0 Z l 5 5 h 5 z m 10 10 l 5 0 0 5 z',
    'M0,0 c1,2,3,4,5,6 s7,8,9,10 q11,12,13,14 t15,16 a17,18,19,0,1,20,21 h22 v23 z',
    'M 100 100 S 150 50 200 100 T 250 100 Q 300 150 350 100 C 400 50 450 150 500 100',
  ];
  for (const d of paths) {
    it(d, () => {
      const p = parsePathData(d);
      expect(p.error).toBeNull();
      const a = new svgPathProperties(d).getTotalLength();
      const b = new svgPathProperties(pathDataToString(p)).getTotalLength();
      expect(a).toBeGreaterThan(0);
      expect(b).toBeCloseTo(a, 6);
    });
  }
});

describe('speed', () => {
  it('parses 20 MB of L commands, every command and the last value read', () => {
    const parts: string[] = ['M0 0'];
    let len = 4;
    let k = 0;
    while (len < 20_000_000) {
      const s = ` L${(k % 1000) * 0.125} ${-((k * 7) % 1000) * 0.5}`;
      parts.push(s);
      len += s.length;
      k++;
    }
    const d = parts.join('');
    // Its speed is benchmarked (npm run bench: the pipeline's parse stage), not timed here.
    const p = parsePathData(d);
    expect(p.error).toBeNull();
    expect(p.ops.length).toBe(k + 1);
    expect(p.args[2 * k + 1]).toBe(-(((k - 1) * 7) % 1000) * 0.5); // checksum: last value read
  }, 60_000);
});
