/**
 * Every report validates against schema/report.schema.json, and the schema
 * is strict enough to reject a report with a field missing or mistyped.
 * Validator: ajv (npm, JSON Schema draft 2020-12).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { refitSvg } from '../../src/refit.js';
import type { FileReport } from '../../src/report/types.js';
import { corpusPath, sharedCorpusSkip } from '../sharedCorpus.js';

const schema = JSON.parse(readFileSync(new URL('../../schema/report.schema.json', import.meta.url), 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: true });
const validate = ajv.compile(schema);

/** The report as a consumer sees it: through JSON (NaN becomes null). */
const asJson = (r: FileReport): unknown => JSON.parse(JSON.stringify(r));
// The corpus lives in shared/ beside the project (as laid for CI too); test/sharedCorpus.ts decides whether these run.
const corpus = (p: string): string => readFileSync(corpusPath(p), 'utf8');
const corpusSkip = sharedCorpusSkip();

const bracket = refitSvg(readFileSync(new URL('../../samples/bracket.svg', import.meta.url), 'utf8'), {}, 'bracket.svg').report;

describe('report schema', () => {
  it('the bundled sample report validates', () => {
    const ok = validate(asJson(bracket));
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
    // The sample has rewritten and kept elements, so both deviation forms were checked.
    expect(bracket.elements.some((e) => e.deviation === null)).toBe(true);
    expect(bracket.elements.some((e) => e.deviation !== null)).toBe(true);
  });

  const files = [
    'w3c-svg11/svg/paths-data-01-t.svg',
    'w3c-svg11/svg/paths-data-02-t.svg',
    'w3c-svg11/svg/shapes-polygon-01-t.svg',
    'w3c-svg11/svg/shapes-rect-02-t.svg',
    'w3c-svg11/svg/coords-trans-01-b.svg',
    'resvg/tests/shapes/path/M-A-trimmed.svg',
    'resvg/tests/shapes/path/invalid-data-in-L.svg',
  ];
  it.skipIf(corpusSkip !== null).each(files)('reports on %s validate (with and without shapes as paths)', (f) => {
    for (const shapesAsPaths of [false, true]) {
      const r = refitSvg(corpus(f), { shapesAsPaths, tolerance: 0.05 }, f).report;
      validate(asJson(r));
      expect(validate.errors ?? []).toEqual([]);
    }
  });

  it('describes every field (the schema is the users\' documentation)', () => {
    const missing: string[] = [];
    const walk = (node: Record<string, unknown>, where: string): void => {
      const props = node.properties as Record<string, Record<string, unknown>> | undefined;
      for (const [k, v] of Object.entries(props ?? {})) {
        if (typeof v.description !== 'string' || v.description.length < 8) missing.push(`${where}.${k}`);
        walk(v, `${where}.${k}`);
      }
    };
    walk(schema, '');
    for (const [k, v] of Object.entries(schema.$defs as Record<string, Record<string, unknown>>)) walk(v, `#${k}`);
    expect(missing).toEqual([]);
  });

  it('rejects a report with a field removed', () => {
    const r = asJson(bracket) as Record<string, unknown>;
    delete r.toleranceMm;
    expect(validate(r)).toBe(false);
    const e = asJson(bracket) as FileReport;
    delete (e.elements[0] as Partial<FileReport['elements'][0]>).keptReason;
    expect(validate(e)).toBe(false);
    const d = asJson(bracket) as FileReport;
    const withDev = d.elements.find((x) => x.deviation !== null)!;
    delete (withDev.deviation as Partial<NonNullable<typeof withDev.deviation>>).resultToOriginal;
    expect(validate(d)).toBe(false);
  });

  it('rejects a report with a field of the wrong type', () => {
    const cases: ((r: FileReport) => void)[] = [
      (r) => { (r as unknown as Record<string, unknown>).bytesIn = '32548'; },
      (r) => { (r.totals as unknown as Record<string, unknown>).withinTolerance = 'yes'; },
      (r) => { (r.elements[0] as unknown as Record<string, unknown>).kept = 1; },
      (r) => { r.elements[0].segmentsAfter.arcs = 1.5; },
      (r) => { r.elements.find((x) => x.deviation)!.deviation!.worstMm = [1, 2, 3] as unknown as [number, number]; },
      (r) => { r.elements[0].commandsBefore.L = -1; },
      (r) => { (r as unknown as Record<string, unknown>).tool = 'other'; },
      (r) => { (r as unknown as Record<string, unknown>).extra = true; },
    ];
    for (const spoil of cases) {
      const r = asJson(bracket) as FileReport;
      spoil(r);
      expect(validate(r)).toBe(false);
    }
  });
});
