import { tankStatusSchema, type TankStatus } from '@shared/parameters/health';
import { tankStyle, type TankStyle } from '@shared/parameters/limit-templates';
import { tankListQuery } from '@shared/schemas/tanks';
import type { TankOverviewFilters } from '../api/get-tank-overview';

/*
 * The console's filters live in the address, so a link or a reload shows the same tanks. An
 * address is typed by people and pasted around: whatever cannot be read is left out rather than
 * sent on to be refused.
 */

/** Worst first, as the overview is ordered. */
export const overviewStatusOrder: readonly TankStatus[] = ['alert', 'watch', 'no-data', 'healthy'];

/** In the address, "everyone" is the explicit choice; no choice at all means the person's default. */
export const everyone = 'everyone';

export interface OverviewAddress {
  q?: string;
  /** A staff member's id, "none" (nobody assigned), "everyone", or null when the address says nothing. */
  technician: string | null;
  status: TankStatus[];
  style?: TankStyle;
}

const maxSearch = 100;

export function readOverviewAddress(params: URLSearchParams): OverviewAddress {
  const q = tankListQuery.shape.q.safeParse(params.get('q')?.slice(0, maxSearch) ?? undefined);
  const technician = params.get('technicianId');
  const asked = new Set(
    params
      .getAll('status')
      .flatMap((value) => value.split(','))
      .map((value) => tankStatusSchema.safeParse(value.trim()))
      .flatMap((parsed) => (parsed.success ? [parsed.data] : [])),
  );
  const style = tankStyle.safeParse(params.get('style') ?? undefined);
  return {
    q: q.success && q.data ? q.data : undefined,
    technician:
      technician === everyone || tankListQuery.shape.technicianId.safeParse(technician).success
        ? technician
        : null,
    status: overviewStatusOrder.filter((status) => asked.has(status)),
    style: style.success ? style.data : undefined,
  };
}

/** The address for `address`, its parts in a fixed order so one choice always reads the same. */
export function overviewSearch(address: OverviewAddress): URLSearchParams {
  const search = new URLSearchParams();
  if (address.q) search.set('q', address.q);
  if (address.technician) search.set('technicianId', address.technician);
  const status = overviewStatusOrder.filter((one) => address.status.includes(one));
  if (status.length > 0) search.set('status', status.join(','));
  if (address.style) search.set('style', address.style);
  return search;
}

/** What to ask the API for; `ownDefault` is whose tanks to show when the address does not say. */
export function overviewFilters(
  address: OverviewAddress,
  ownDefault: string | undefined,
): TankOverviewFilters {
  const technicianId =
    address.technician === null
      ? ownDefault
      : address.technician === everyone
        ? undefined
        : address.technician;
  return {
    q: address.q,
    technicianId,
    status: address.status.length > 0 ? address.status : undefined,
    style: address.style,
  };
}

/** Any narrowing beyond whose tanks these are: a search, a status, a style or another technician. */
export function narrowsOverview(address: OverviewAddress, ownId: string | undefined): boolean {
  const otherTechnician =
    address.technician !== null && address.technician !== everyone && address.technician !== ownId;
  return Boolean(address.q || address.status.length > 0 || address.style || otherTechnician);
}
