/**
 * One verdict per source element from the proof's verdicts per written
 * machine element: an element drawn where it stands and by its `<use>`
 * copies is within the tolerance when every drawing of it is; its deviation
 * is the worst of them.
 */
import type { Deviation } from '../report/types.js';
import type { MachineElementProof } from './proof.js';

/** The verdict on a source element. */
export interface ElementVerdict {
  index: number;
  deviation: Deviation | null;
  ok: boolean;
  /** Which drawing the deviation is of, for messages: '' where it stands, `copy 2: ` for a copy. */
  where: string;
}

/** Combine the proof's verdicts per element index, in the order the elements first appear. */
export function elementVerdicts(proofs: readonly MachineElementProof[]): ElementVerdict[] {
  const out = new Map<number, ElementVerdict>();
  for (const p of proofs) {
    const where = p.copy ? `copy ${p.copy}: ` : '';
    const have = out.get(p.index);
    if (!have) {
      out.set(p.index, { index: p.index, deviation: p.deviation, ok: p.ok, where });
      continue;
    }
    const worse = worseThan(p, have);
    have.ok = have.ok && p.ok;
    if (worse) Object.assign(have, { deviation: p.deviation, where });
  }
  return [...out.values()];
}

/** Whether verdict a is worse than b: failed before passed, then not found (null) before measured, then the larger deviation. */
function worseThan(a: { ok: boolean; deviation: Deviation | null }, b: { ok: boolean; deviation: Deviation | null }): boolean {
  if (a.ok !== b.ok) return !a.ok;
  if (!a.ok && (a.deviation === null) !== (b.deviation === null)) return a.deviation === null;
  // Both passed: a drawing with nothing to measure (null) never outweighs a measured one.
  if (a.deviation === null) return false;
  return b.deviation === null || a.deviation.max > b.deviation.max;
}
