import { describe, expect, it } from 'vitest';
import type { TankOverviewPage, TankSummary } from '@shared/schemas/tanks';
import {
  matchingTankCount,
  mergeTankOverviewPages,
  tankOverviewSearch,
} from '../../../../web/features/tanks/api/get-tank-overview';
import {
  narrowsOverview,
  overviewFilters,
  overviewSearch,
  readOverviewAddress,
} from '../../../../web/features/tanks/utils/overview-address';

const wren = '0b7f4c1e-6a55-4d0e-9f3b-2c1d8e7a6b50';
const counts = { alert: 2, watch: 1, 'no-data': 0, healthy: 4 };

function tank(id: string, status: TankSummary['status']): TankSummary {
  return {
    id,
    name: `Tank ${id.slice(0, 4)}`,
    siteLabel: null,
    waterType: 'marine',
    style: 'mixed-reef',
    displayVolumeL: 300,
    sumpVolumeL: 0,
    serviceIntervalDays: 14,
    assignedTechnician: null,
    owners: [],
    coverPhoto: null,
    status,
    statusReason: '',
    lastVisitAt: null,
    visitOverdue: false,
    nextVisit: null,
  };
}

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;

describe('readOverviewAddress', () => {
  it('reads every filter the console writes, statuses worst first', () => {
    const address = readOverviewAddress(
      new URLSearchParams(`q=dental&technicianId=${wren}&status=healthy,alert&style=mixed-reef`),
    );

    expect(address).toEqual({
      q: 'dental',
      technician: wren,
      status: ['alert', 'healthy'],
      style: 'mixed-reef',
    });
  });

  it('accepts statuses repeated as well as comma-separated, once each', () => {
    const address = readOverviewAddress(new URLSearchParams('status=watch&status=alert,watch'));

    expect(address.status).toEqual(['alert', 'watch']);
  });

  it('leaves out what it cannot read instead of sending it on to be refused', () => {
    const address = readOverviewAddress(
      new URLSearchParams('q=%20%20&technicianId=tomas&status=burning,watch&style=pond'),
    );

    expect(address).toEqual({ q: undefined, technician: null, status: ['watch'], style: undefined });
  });

  it('keeps "everyone" and "none" as choices, and no choice as null', () => {
    expect(readOverviewAddress(new URLSearchParams('technicianId=everyone')).technician).toBe('everyone');
    expect(readOverviewAddress(new URLSearchParams('technicianId=none')).technician).toBe('none');
    expect(readOverviewAddress(new URLSearchParams('')).technician).toBeNull();
  });

  it('cuts a pasted search to the 100 characters the API reads', () => {
    const address = readOverviewAddress(new URLSearchParams(`q=${'a'.repeat(140)}`));

    expect(address.q).toHaveLength(100);
  });

  it('reads back exactly what overviewSearch wrote', () => {
    const written = {
      q: 'reef',
      technician: 'everyone',
      status: ['watch', 'no-data'] as const,
      style: undefined,
    };
    const search = overviewSearch({ ...written, status: [...written.status] });

    expect(search.toString()).toBe('q=reef&technicianId=everyone&status=watch%2Cno-data');
    expect(readOverviewAddress(search)).toEqual({ ...written, status: ['watch', 'no-data'] });
  });
});

describe('overviewFilters', () => {
  it("asks for the person's default when the address names nobody, and for everyone on 'everyone'", () => {
    const address = readOverviewAddress(new URLSearchParams('status=alert'));

    expect(overviewFilters(address, wren)).toMatchObject({ technicianId: wren, status: ['alert'] });
    expect(overviewFilters({ ...address, technician: 'everyone' }, wren).technicianId).toBeUndefined();
    expect(overviewFilters({ ...address, technician: 'none' }, wren).technicianId).toBe('none');
  });

  it('counts a search, a status, a style or another technician as narrowing, but not whose tanks', () => {
    const plain = readOverviewAddress(new URLSearchParams(''));

    expect(narrowsOverview(plain, wren)).toBe(false);
    expect(narrowsOverview({ ...plain, technician: wren }, wren)).toBe(false);
    expect(narrowsOverview({ ...plain, technician: 'everyone' }, wren)).toBe(false);
    expect(narrowsOverview({ ...plain, technician: 'none' }, wren)).toBe(true);
    expect(narrowsOverview({ ...plain, status: ['alert'] }, wren)).toBe(true);
    expect(narrowsOverview({ ...plain, style: 'sps-reef' }, wren)).toBe(true);
    expect(narrowsOverview({ ...plain, q: 'x' }, wren)).toBe(true);
  });
});

describe('tankOverviewSearch', () => {
  it('sends statuses as one comma list and the cursor as after', () => {
    const search = tankOverviewSearch({ technicianId: 'none', status: ['alert', 'watch'] }, 'abc_-1');

    expect(Object.fromEntries(search)).toEqual({
      technicianId: 'none',
      status: 'alert,watch',
      after: 'abc_-1',
    });
  });
});

describe('mergeTankOverviewPages', () => {
  const page = (tanks: TankSummary[], next: string | null, pageCounts = counts): TankOverviewPage => ({
    tanks,
    next,
    counts: pageCounts,
  });

  it('lists the pages in order, with the newest counts, complete only after the last page', () => {
    const first = page([tank(id(1), 'alert'), tank(id(2), 'alert')], 'c1');
    const newer = { ...counts, alert: 3 };
    const second = page([tank(id(3), 'watch')], null, newer);

    const partial = mergeTankOverviewPages({ pages: [first], pageParams: [undefined] });
    const whole = mergeTankOverviewPages({ pages: [first, second], pageParams: [undefined, 'c1'] });

    expect(partial.complete).toBe(false);
    expect(partial.tanks.map((one) => one.id)).toEqual([id(1), id(2)]);
    expect(whole.complete).toBe(true);
    expect(whole.tanks.map((one) => one.id)).toEqual([id(1), id(2), id(3)]);
    expect(whole.counts).toEqual(newer);
  });

  it('shows a tank once when its status changed between two pages and it came back on both', () => {
    const first = page([tank(id(1), 'alert'), tank(id(2), 'watch')], 'c1');
    const second = page([tank(id(1), 'healthy'), tank(id(4), 'healthy')], null);

    const merged = mergeTankOverviewPages({ pages: [first, second], pageParams: [undefined, 'c1'] });

    expect(merged.tanks.map((one) => [one.id, one.status])).toEqual([
      [id(1), 'alert'],
      [id(2), 'watch'],
      [id(4), 'healthy'],
    ]);
  });
});

describe('matchingTankCount', () => {
  it('adds the statuses asked for, or every status when none is', () => {
    expect(matchingTankCount(counts)).toBe(7);
    expect(matchingTankCount(counts, [])).toBe(7);
    expect(matchingTankCount(counts, ['alert', 'watch'])).toBe(3);
  });
});
