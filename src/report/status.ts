/**
 * Outcomes as data: each element's status and reason code, set in one place,
 * and the verdicts read off them (never off the wording of a message).
 */
import type { ElementReport, OutcomeReason, OutcomeStatus } from './types.js';

/** The status each reason implies: decided before writing (kept) or after checking what was written (reverted). */
export const REASON_STATUS: Readonly<Record<OutcomeReason, Exclude<OutcomeStatus, 'refitted'>>> = Object.freeze({
  'exact-shape': 'kept',
  'not-drawn': 'kept',
  'cannot-invert': 'kept',
  'too-few-digits': 'kept',
  'cannot-flatten': 'kept',
  'no-shorter': 'kept',
  'grows': 'kept',
  'already-refitted': 'kept',
  'restyled': 'reverted',
  'over-tolerance': 'reverted',
  'cannot-measure': 'reverted',
  'unreadable-output': 'reverted',
  'nothing-to-measure': 'reverted',
});

/** Mark an element as left as written (kept or reverted, as the reason implies), with a message for people. */
export function setUnchanged(e: ElementReport, reason: OutcomeReason, message: string): void {
  e.status = REASON_STATUS[reason];
  e.reason = reason;
  e.kept = true;
  e.keptReason = message;
}

/** Mark an element as rewritten by the refit. */
export function setRefitted(e: ElementReport): void {
  e.status = 'refitted';
  e.reason = null;
  e.kept = false;
  e.keptReason = null;
}

/** True when the element was reverted because its measured deviation is over the tolerance. */
export function isOverTolerance(e: Pick<ElementReport, 'reason'>): boolean {
  return e.reason === 'over-tolerance';
}

/** The file's verdict: no element was reverted for its measured deviation. */
export function withinTolerance(elements: readonly Pick<ElementReport, 'reason'>[]): boolean {
  return !elements.some(isOverTolerance);
}
