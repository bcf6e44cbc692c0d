// What a rep can ask the dealer for. The checklist the dealer sees is a list of plain sentences
// (the machine stores strings); these are the building blocks of the rep's form.
export const REQUEST_ITEMS = [
  { key: 'photos', label: 'More photos', detail: 'Photos of what?', sentence: (d: string) => `More photos: ${d}` },
  { key: 'load_test', label: 'A new load test', detail: 'Anything to change in the run? (optional)', sentence: (d: string) => (d ? `A new load test before the repair: ${d}` : 'A new load test before the repair') },
  { key: 'proof_of_purchase', label: 'Proof of purchase', detail: null, sentence: () => 'Proof of purchase showing the retail sale date' },
  { key: 'diagnostic_log', label: 'A diagnostic log', detail: 'From which tool or test? (optional)', sentence: (d: string) => (d ? `A diagnostic log: ${d}` : 'A diagnostic log from the diagnostic tool') },
  { key: 'other', label: 'Something else', detail: 'What exactly?', sentence: (d: string) => d },
] as const;

export type RequestItemKey = (typeof REQUEST_ITEMS)[number]['key'];

/** Items whose detail is required (the sentence means nothing without it). */
export const DETAIL_REQUIRED: readonly RequestItemKey[] = ['photos', 'other'];

export type RequestChoice = { key: RequestItemKey; detail: string };

/** The checklist sentences for the chosen items, or the first problem with them. */
export function checklistFrom(choices: readonly RequestChoice[]): { ok: true; checklist: string[] } | { ok: false; field: string; message: string } {
  if (!choices.length) return { ok: false, field: 'items', message: 'Tick at least one thing the dealer must send.' };
  const checklist: string[] = [];
  for (const c of choices) {
    const item = REQUEST_ITEMS.find((i) => i.key === c.key);
    if (!item) return { ok: false, field: 'items', message: `"${c.key}" is not something the checklist knows.` };
    const detail = c.detail.trim();
    if (DETAIL_REQUIRED.includes(item.key) && !detail) return { ok: false, field: `detail.${item.key}`, message: `${item.detail}` };
    checklist.push(item.sentence(detail));
  }
  return { ok: true, checklist };
}
