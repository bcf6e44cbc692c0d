import type { MemoForMatching, ReferenceField } from './types';

/** Keys shorter than this are not searched for inside free text: too likely to occur by chance. */
export const MIN_REFERENCE_KEY_LENGTH = 4;
const PREFIX = 3;

/** Upper case, letters and digits only: "cm 2025-001337/0" → "CM20250013370". */
export function normalizeReference(text: string): string {
  return text.toUpperCase().replace(/[^A-Z0-9]/g, '');
}

export interface ReferenceHit<M extends MemoForMatching = MemoForMatching> {
  memo: M;
  field: ReferenceField;
}

/**
 * Finds which memo numbers, claim numbers and RMA numbers occur in a line's reference, ignoring
 * case, spaces and punctuation. A key must start and end on a boundary of the written text (its
 * edge, a separator, or a change between letters and digits), so "CM-2025-001337-0" is found in
 * "paid cm 2025 001337 0 / march" but not inside a longer run of digits. Cost per line is linear in
 * the reference length times the few key lengths sharing a 3-character prefix: no scan of all memos.
 */
export class ReferenceIndex<M extends MemoForMatching = MemoForMatching> {
  private readonly keys = new Map<string, ReferenceHit<M>[]>();
  private readonly lengthsByPrefix = new Map<string, number[]>();

  constructor(memos: readonly M[]) {
    for (const memo of memos) {
      this.add(memo.number, memo, 'memo_number');
      this.add(memo.claimNumber, memo, 'claim_number');
      if (memo.rmaNumber) this.add(memo.rmaNumber, memo, 'rma_number');
    }
  }

  private add(raw: string, memo: M, field: ReferenceField): void {
    const key = normalizeReference(raw);
    if (key.length < MIN_REFERENCE_KEY_LENGTH) return;
    const hits = this.keys.get(key);
    if (hits) hits.push({ memo, field });
    else this.keys.set(key, [{ memo, field }]);
    const prefix = key.slice(0, PREFIX);
    const lengths = this.lengthsByPrefix.get(prefix);
    if (!lengths) this.lengthsByPrefix.set(prefix, [key.length]);
    else if (!lengths.includes(key.length)) lengths.push(key.length);
  }

  find(reference: string): ReferenceHit<M>[] {
    const upper = reference.toUpperCase();
    const separatedBefore = new Uint8Array(upper.length + 1);
    let text = '';
    let pendingSeparator = true;
    for (let k = 0; k < upper.length; k++) {
      const c = upper.charCodeAt(k);
      if ((c >= 65 && c <= 90) || (c >= 48 && c <= 57)) {
        if (pendingSeparator) separatedBefore[text.length] = 1;
        text += upper[k];
        pendingSeparator = false;
      } else {
        pendingSeparator = true;
      }
    }
    const n = text.length;
    const isDigit = (i: number) => text.charCodeAt(i) <= 57;
    const boundary = (i: number) => i === 0 || i === n || separatedBefore[i] === 1 || isDigit(i - 1) !== isDigit(i);

    const out: ReferenceHit<M>[] = [];
    for (let i = 0; i + MIN_REFERENCE_KEY_LENGTH <= n; i++) {
      if (!boundary(i)) continue;
      const lengths = this.lengthsByPrefix.get(text.slice(i, i + PREFIX));
      if (!lengths) continue;
      for (const len of lengths) {
        if (i + len > n || !boundary(i + len)) continue;
        const hits = this.keys.get(text.slice(i, i + len));
        if (hits) out.push(...hits);
      }
    }
    return out;
  }
}
