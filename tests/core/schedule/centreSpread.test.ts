import { describe, expect, it } from 'vitest';
import { spreadSlots } from '../../../src/core/schedule/centreSpread.js';

// The even-spread rule is our convention (header of src/core/schedule/centreSpread.ts); expected slots below are worked by hand from round(k·(n − 1)/(c − 1)).
describe('centre replicate slots', () => {
  it('opens, halves and closes the campaign with 3 replicates', () => {
    expect(spreadSlots(3, 18)).toEqual([0, 9, 17]); // round(8.5) = 9
    expect(spreadSlots(3, 7)).toEqual([0, 3, 6]);
  });
  it('puts one replicate mid-campaign and spaces 4 evenly', () => {
    expect(spreadSlots(1, 10)).toEqual([4]);
    expect(spreadSlots(4, 10)).toEqual([0, 3, 6, 9]);
    expect(spreadSlots(2, 5)).toEqual([0, 4]);
  });
  it('stays distinct when every slot is a replicate', () => {
    expect(spreadSlots(5, 5)).toEqual([0, 1, 2, 3, 4]);
    expect(spreadSlots(4, 5)).toEqual([0, 1, 3, 4]);
    expect(spreadSlots(0, 5)).toEqual([]);
  });
});
