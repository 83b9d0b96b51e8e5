import { differingFields } from './sync.store';

describe('differingFields', () => {
  it('lists only the fields whose values differ, nested values compared whole', () => {
    const device = { id: 'a', heightM: 3, hazards: ['mercury'], notes: 'same' };
    const server = { id: 'a', heightM: 2.4, hazards: ['mercury', 'traffic'], notes: 'same' };

    expect(differingFields(device, server)).toEqual([
      { field: 'heightM', deviceValue: 3, serverValue: 2.4 },
      { field: 'hazards', deviceValue: ['mercury'], serverValue: ['mercury', 'traffic'] },
    ]);
  });

  it('shows a field only one side has', () => {
    expect(differingFields({ id: 'a' }, { id: 'a', moisturePct: 9 })).toEqual([{ field: 'moisturePct', deviceValue: undefined, serverValue: 9 }]);
  });
});
