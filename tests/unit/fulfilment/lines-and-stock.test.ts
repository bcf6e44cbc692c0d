import { describe, expect, it } from 'vitest';
import { adjustmentProblem, approvedPartLines, lineAvailability, linesFromDealerStock, linesToShip, nothingShipsText, pickProblem, shortageProblem, type PartLine } from '@/lib/fulfilment';

const line = (lineId: string, partId: string, quantity = 1, fromDealerStock = false): PartLine => ({ lineId, partId, partNumber: partId.toUpperCase(), name: `Part ${partId}`, quantity, fromDealerStock });

describe('lines to ship', () => {
  it('takes the approved lines when the decision wrote them, else the requested lines marked approved', () => {
    const requested = { parts: [line('p1', 'bp500'), line('p2', 'ch4')] };
    expect(approvedPartLines({ parts: [line('p1', 'bp500')] }, requested, [])).toEqual([line('p1', 'bp500')]);
    expect(approvedPartLines(null, requested, [{ lineId: 'p1', approved: false }, { lineId: 'p2', approved: true }])).toEqual([line('p2', 'ch4')]);
    expect(approvedPartLines(null, requested, [])).toEqual([]);
  });

  it('lines from the dealer’s own stock are credited, not shipped', () => {
    const all = [line('p1', 'bp500'), line('p2', 'ch4', 1, true)];
    expect(linesToShip(all).map((l) => l.lineId)).toEqual(['p1']);
    expect(linesFromDealerStock(all).map((l) => l.lineId)).toEqual(['p2']);
  });

  it('every line must be picked, and only the claim’s own lines', () => {
    const toShip = [line('p1', 'bp500'), line('p2', 'ch4', 2)];
    expect(pickProblem(toShip, ['p1', 'p2'])).toBeNull();
    expect(pickProblem(toShip, ['p1'])).toBe('Tick every line as picked before shipping; not picked yet: 2 × CH4.');
    expect(pickProblem(toShip, ['p1', 'p2', 'p9'])).toMatch(/Line p9 is not one of this claim’s lines/);
    expect(pickProblem([], [])).toMatch(/no parts to send/);
  });
});

describe('stock standing of each line', () => {
  it('two lines of the same part need their sum on the shelf', () => {
    const toShip = [line('p1', 'bp500'), line('p2', 'bp500')];
    const one = lineAvailability(toShip, new Map([['bp500', { onHand: 1, restockExpectedOn: '2027-01-15' }]]));
    expect(one.map((a) => a.inStock)).toEqual([false, false]);
    expect(one[0]!.expectedOn).toBe('2027-01-15');
    const two = lineAvailability(toShip, new Map([['bp500', { onHand: 2, restockExpectedOn: null }]]));
    expect(two.map((a) => a.inStock)).toEqual([true, true]);
    expect(shortageProblem(two)).toBeNull();
  });

  it('a part with no stock row has none; the refusal names what is short and when more comes', () => {
    const a = lineAvailability([line('p1', 'du85')], new Map());
    expect(a[0]).toMatchObject({ onHand: 0, inStock: false, expectedOn: null });
    expect(shortageProblem(a)).toBe('Not enough stock to ship: DU85 (0 on hand, 1 needed). Nothing was shipped; the line stays back-ordered.');
  });
});

describe('adjustment reasons', () => {
  it('each reason allows its own sign; "other" needs a note; zero is refused', () => {
    expect(adjustmentProblem('delivery_received', 5, '')).toBeNull();
    expect(adjustmentProblem('delivery_received', -5, '')).toMatch(/adds stock/);
    expect(adjustmentProblem('damaged_in_store', 1, '')).toMatch(/removes stock/);
    expect(adjustmentProblem('returned_to_supplier', -2, '')).toBeNull();
    expect(adjustmentProblem('count_correction', -3, '')).toBeNull();
    expect(adjustmentProblem('count_correction', 0, '')).toMatch(/zero changes nothing/);
    expect(adjustmentProblem('other', 2, ' ')).toMatch(/Say in the note why/);
    expect(adjustmentProblem('other', 2, 'Found behind the racking')).toBeNull();
  });
});

describe('nothingShipsText', () => {
  it('names the shop’s own stock when an approved part came from it, else says no part was approved', () => {
    expect(nothingShipsText([{ quantity: 1, fromDealerStock: true }], 'dealer')).toBe('Nothing ships: you fitted the approved parts from your own stock.');
    expect(nothingShipsText([{ quantity: 0, fromDealerStock: false }], 'dealer')).toBe('Nothing ships: no replacement part was approved.');
    expect(nothingShipsText([], 'brand')).toBe('Nothing to ship: no replacement part was approved.');
    expect(nothingShipsText([{ quantity: 2, fromDealerStock: true }], 'brand')).toBe('Nothing to ship: the dealer fitted every approved part from its own stock.');
  });
});
