/**
 * The one place that decides whether tests needing `../shared` (the
 * conformance corpus laid beside the project, not part of the repository; see
 * the README, "Set-up") run. Without the corpus and without `CI` they skip with
 * a one-line reason, so a fresh clone passes `npm ci && npm test`; with `CI`
 * set they always run, and a missing corpus fails them loudly instead of
 * passing silently.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The corpus's suite folder: ../shared/corpus/suite beside the project. */
export const CORPUS_SUITE = fileURLToPath(new URL('../../shared/corpus/suite', import.meta.url));
const MANIFEST = join(CORPUS_SUITE, 'MANIFEST.tsv');

/** Whether `CI` is set to something meaning yes (CI services set CI=true; "", "0" and "false" mean no). */
export function ciIsSet(value: string | undefined): boolean {
  return value !== undefined && value !== '' && value !== '0' && value.toLowerCase() !== 'false';
}

/**
 * The decision: `null` to run the corpus tests, or the one-line reason to skip them.
 * @throws Error naming the missing file when CI is set and the corpus is absent
 */
export function corpusSkipReason(present: boolean, ci: string | undefined, manifest: string = MANIFEST): string | null {
  if (present) return null;
  if (ciIsSet(ci)) {
    throw new Error(`conformance corpus missing: ${manifest} not found, and CI is set, so the tests that need it must run (README, "Set-up")`);
  }
  return `corpus tests skipped: ${manifest} not found (../shared beside the project) and CI unset`;
}

/** The structure corpus (styles, symbol, use): ../shared/corpus/structure beside the project. */
export const CORPUS_STRUCTURE = fileURLToPath(new URL('../../shared/corpus/structure', import.meta.url));

/** As {@link sharedCorpusSkip}, for the structure corpus. */
export function structureCorpusSkip(): string | null {
  const manifest = join(CORPUS_STRUCTURE, 'MANIFEST.tsv');
  const reason = corpusSkipReason(existsSync(manifest), process.env.CI, manifest);
  if (reason !== null) console.warn(reason);
  return reason;
}

/** Null when the corpus tests run here; else why they skip (printed once per test file that asks). Throws under CI without the corpus. */
export function sharedCorpusSkip(): string | null {
  const reason = corpusSkipReason(existsSync(MANIFEST), process.env.CI);
  if (reason !== null) console.warn(reason);
  return reason;
}

/** A corpus file's text path (`p` relative to the suite folder). */
export function corpusPath(p: string): string {
  return join(CORPUS_SUITE, p);
}
