import { describe, expect, it } from 'vitest';
import { areaName, readableFolderName } from '../../src/render/area-names.ts';

describe('area names', () => {
  it('reads the demo folders as people say them, never the bare folder name', () => {
    expect(readableFolderName('k-210-resin')).toBe('K-210 resin');
    expect(readableFolderName('h-220-hot-oil')).toBe('H-220 hot oil');
    expect(readableFolderName('unloading')).toBe('Unloading');
    expect(readableFolderName('(top level)')).toBe('General');
  });
  it('takes the register name by folder id, else by where most equipment stands', () => {
    const register = {
      areas: new Map([['k-210-resin', { name: 'Kettle K-210 resin line' }], ['tank-farm', { name: 'Tank farm' }]]),
      equipment: new Map([['T-230', { area: 'tank-farm' }], ['P-231', { area: 'tank-farm' }], ['K-210', { area: 'k-210-resin' }]]),
    };
    expect(areaName('k-210-resin', [], register)).toBe('Kettle K-210 resin line');
    expect(areaName('t-230-blending', ['T-230', 'P-231', 'K-210'], register)).toBe('Tank farm');
    expect(areaName('utilities', ['N-1'], register)).toBe('Utilities');
    expect(areaName('utilities', ['N-1'])).toBe('Utilities');
  });
});
