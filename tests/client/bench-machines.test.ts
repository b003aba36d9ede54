import { describe, expect, it } from 'vitest';
import { matchMachines } from '../../src/features/bench/lib/machines';
import type { VehicleDto as Vehicle } from '@shared/schema/vehicle';

// An invented fleet; the VIN is the 49 CFR 565.15 worked example (check digit X).
const vehicle = (v: Omit<Vehicle, 'notes' | 'updatedAt'>): Vehicle => ({ ...v, notes: '', updatedAt: '2026-12-01T09:00:00Z' });
const fleet: Vehicle[] = [
  vehicle({ id: '1', label: 'W-01', model: 'Wren 50 two-stroke scooter', frameNumber: 'WR50-00117', hours: 310, lastDiagnosedAt: '2026-11-02T09:00:00Z' }),
  vehicle({ id: '2', label: 'W-02', model: 'Wren 50 two-stroke scooter', frameNumber: '', hours: null, lastDiagnosedAt: '2026-12-01T09:00:00Z' }),
  vehicle({ id: '3', label: 'B-01', model: 'Badger 110 youth quad', frameNumber: '1M8GDM9AXKP042788', hours: 95, lastDiagnosedAt: null }),
  vehicle({ id: '4', label: 'H-10', model: 'Heron 125 pit bike', frameNumber: 'HR125-0042', hours: 12, lastDiagnosedAt: null }),
];
const labels = (q: string) => matchMachines(fleet, q).map((v) => v.label);

describe('finding a machine on the start page', () => {
  it('with nothing typed, lists every machine, the most recently diagnosed first', () => {
    expect(labels('')).toEqual(['W-02', 'W-01', 'B-01', 'H-10']);
  });
  it('finds a machine by its fleet label, ignoring case, and puts a label that starts with it first', () => {
    expect(labels('b-0')).toEqual(['B-01']);
    expect(labels('h-1')).toEqual(['H-10']);
  });
  it('finds machines by model words in any order', () => {
    expect(labels('scooter wren')).toEqual(['W-02', 'W-01']);
    expect(labels('quad')).toEqual(['B-01']);
  });
  it('finds a VIN or frame number typed with spaces, dashes or lower case', () => {
    expect(labels('1m8 gdm9')).toEqual(['B-01']);
    expect(labels('hr1250042')).toEqual(['H-10']);
    expect(labels('wr50-00117')).toEqual(['W-01']);
  });
  it('finds nothing when one of the words matches nothing', () => {
    expect(labels('wren heron')).toEqual([]);
  });
});
