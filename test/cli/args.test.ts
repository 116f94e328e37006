import { describe, expect, it } from 'vitest';
import { buildProgram, describeDefault, OPTION_FLAGS, parsedArgs } from '../../src/cli/args.js';
import { DEFAULT_OPTIONS, OPTION_DOCS, type Options } from '../../src/options.js';

function parse(argv: string[]) {
  const sink = { text: '' };
  const program = buildProgram({ writeOut: (t) => (sink.text += t), writeErr: (t) => (sink.text += t), width: 80 }, '');
  program.parse(argv, { from: 'user' });
  return parsedArgs(program);
}

describe('flags onto the options object', () => {
  it('gives every library option exactly one flag', () => {
    expect(Object.keys(OPTION_FLAGS).sort()).toEqual(Object.keys(DEFAULT_OPTIONS).sort());
    const longs = Object.values(OPTION_FLAGS).map((f) => /--[a-z-]+/.exec(f)![0]);
    expect(new Set(longs).size).toBe(longs.length);
  });

  it('adds no defaults: no flags give an empty options object', () => {
    expect(parse(['in.svg']).options).toEqual({});
  });

  it('maps every flag onto its option, with units converted to mm', () => {
    const a = parse(['in.svg', '-t', '0.1in', '--corner-angle', '12.5', '--bake-transforms', '--shapes-as-paths', '--unitless-size', '1pt', '--digits', '0']);
    const want: Partial<Options> = {
      tolerance: 2.54, cornerAngle: 12.5, bakeTransforms: true, shapesAsPaths: true,
      assumedMmPerUnit: 25.4 / 72, // CSS Values 3 §5.2: 1pt = 1/72 in
      digits: 0, // 0 must pass (options use ??, not ||)
    };
    expect(Object.keys(a.options).sort()).toEqual(Object.keys(want).sort());
    for (const k of Object.keys(want) as (keyof Options)[]) {
      const v = a.options[k];
      if (typeof v === 'number') expect(v).toBeCloseTo(want[k] as number, 12);
      else expect(v).toBe(want[k]);
    }
    expect(a.inputs).toEqual(['in.svg']);
  });

  it('maps the path plan flags; a --no- flag not given sets nothing', () => {
    expect(parse(['in.svg', '--plan', '--holes-first', '--join-distance', '0.2mm']).options).toEqual({ plan: true, holesFirst: true, joinDistance: 0.2 });
    expect(parse(['in.svg', '--plan', '--no-plan-join', '--no-plan-doubles', '--no-plan-order']).options).toEqual({ plan: true, planJoin: false, planDoubles: false, planOrder: false });
    // 0 joins only ends that coincide; 0.01in is 0.254 mm (CSS Values 3 §5.2).
    expect(parse(['in.svg', '--join-distance', '0']).options.joinDistance).toBe(0);
    expect(parse(['in.svg', '--join-distance', '0.01in']).options.joinDistance).toBeCloseTo(0.254, 12);
    expect(() => parse(['in.svg', '--join-distance', 'far'])).toThrow(/far/);
  });

  it('reads the command flags', () => {
    const a = parse(['-', '-o', '-', '--report', 'r.json', '--in-place', '--no-backup', '-q', '--debug']);
    expect(a.inputs).toEqual(['-']);
    expect(a.flags).toEqual({ output: '-', report: 'r.json', inPlace: true, backup: false, quiet: true, debug: true, table: false });
    expect(parse(['x.svg']).flags).toEqual({ output: undefined, report: undefined, inPlace: false, backup: true, quiet: false, debug: false, table: false });
  });

  it('a bad value is a commander error naming the flag and the value', () => {
    expect(() => parse(['in.svg', '--digits', 'many'])).toThrow(/--digits.*many/);
    expect(() => parse(['in.svg', '-t', '5 parsecs'])).toThrow(/5 parsecs/);
  });
});

describe('--help shows the defaults of DEFAULT_OPTIONS and the meanings of OPTION_DOCS', () => {
  it('prints each option with its meaning and default', () => {
    let text = '';
    const program = buildProgram({ writeOut: (t) => (text += t), writeErr: () => undefined, width: 1000 }, '');
    program.exitOverride();
    expect(() => program.parse(['--help'], { from: 'user' })).toThrow();
    for (const k of Object.keys(OPTION_DOCS) as (keyof Options)[]) {
      const line = text.split('\n').find((l) => l.includes(OPTION_FLAGS[k]))!;
      expect(line, k).toContain(OPTION_DOCS[k].meaning);
      if (describeDefault(k)) expect(line).toContain(`(default: ${describeDefault(k)})`);
    }
  });

  it('formats the defaults from the object, not from copies', () => {
    expect(describeDefault('tolerance')).toBe(`${DEFAULT_OPTIONS.tolerance} mm`);
    expect(describeDefault('bakeTransforms')).toBe(DEFAULT_OPTIONS.bakeTransforms ? 'on' : 'off');
    // 25.4/96 mm: one CSS px (CSS Values 3 §5.2), shown to 7 significant digits.
    expect(describeDefault('assumedMmPerUnit')).toBe(`${+DEFAULT_OPTIONS.assumedMmPerUnit.toPrecision(7)} mm`);
    expect(describeDefault('digits')).toBe(DEFAULT_OPTIONS.digits === null ? '' : `${DEFAULT_OPTIONS.digits} count`);
  });
});
