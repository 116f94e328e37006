/** The decision of test/sharedCorpus.ts: skip only outside CI, fail loudly in CI (the project's rule for tests needing ../shared). */
import { describe, expect, it } from 'vitest';
import { ciIsSet, corpusSkipReason } from './sharedCorpus.js';

describe('tests that need ../shared', () => {
  it('run when the corpus is there, CI or not', () => {
    for (const ci of [undefined, '', 'true', '1']) expect(corpusSkipReason(true, ci)).toBeNull();
  });

  it('skip with a one-line reason without the corpus and without CI', () => {
    for (const ci of [undefined, '', '0', 'false', 'FALSE']) {
      const r = corpusSkipReason(false, ci);
      expect(r).toMatch(/corpus.*skipped/);
      expect(r).not.toContain('\n');
    }
  });

  it('fail loudly, naming the missing manifest, without the corpus under CI', () => {
    for (const ci of ['true', '1', 'yes']) expect(() => corpusSkipReason(false, ci)).toThrow(/corpus missing: .*MANIFEST\.tsv not found, and CI is set/);
    expect(ciIsSet('true')).toBe(true);
    expect(ciIsSet('false')).toBe(false);
  });
});
