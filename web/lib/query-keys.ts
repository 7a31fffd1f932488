import type { TankListQuery } from '@shared/schemas/tanks';

/*
 * One key factory per resource. Everything about one tank hangs under `tankKeys.detail(id)`, so a
 * single invalidation refreshes its page (readings, livestock, equipment, photos, alerts on it);
 * features extend these keys rather than starting their own roots.
 */

export const tankKeys = {
  all: ['tanks'] as const,
  lists: () => [...tankKeys.all, 'list'] as const,
  list: (query: Partial<TankListQuery> = {}) => [...tankKeys.lists(), query] as const,
  /** The staff overview's pages for one set of filters (the cursor is each page's, not the key's). */
  overview: (filters: object) => [...tankKeys.all, 'overview', filters] as const,
  /** Every visible tank's name, site and owners, for pickers and labels. */
  choices: () => [...tankKeys.all, 'choices'] as const,
  detail: (tankId: string) => [...tankKeys.all, 'detail', tankId] as const,
  photos: (tankId: string) => [...tankKeys.detail(tankId), 'photos'] as const,
  readings: (tankId: string) => [...tankKeys.detail(tankId), 'readings'] as const,
  latestReadings: (tankId: string) => [...tankKeys.readings(tankId), 'latest'] as const,
  readingHistory: (tankId: string, request: object) =>
    [...tankKeys.readings(tankId), 'history', request] as const,
  readingList: (tankId: string, filters: object) => [...tankKeys.readings(tankId), 'list', filters] as const,
  limits: (tankId: string) => [...tankKeys.detail(tankId), 'limits'] as const,
  devices: (tankId: string) => [...tankKeys.detail(tankId), 'devices'] as const,
  equipment: (tankId: string) => [...tankKeys.detail(tankId), 'equipment'] as const,
  livestock: (tankId: string) => [...tankKeys.detail(tankId), 'livestock'] as const,
  livestockCheck: (tankId: string, speciesId: string) =>
    [...tankKeys.detail(tankId), 'livestock-check', speciesId] as const,
  comfortRange: (tankId: string) => [...tankKeys.detail(tankId), 'comfort-range'] as const,
  technicians: () => [...tankKeys.all, 'technicians'] as const,
  visits: (tankId: string) => [...tankKeys.detail(tankId), 'visits'] as const,
  timeline: (tankId: string, kinds: readonly string[]) =>
    [...tankKeys.detail(tankId), 'timeline', kinds] as const,
  tipSuggestions: (tankId: string) => [...tankKeys.detail(tankId), 'tip-suggestions'] as const,
};

/** A visit and its report; the schedule lists hang under `visitKeys.schedules()`. */
export const visitKeys = {
  all: ['visits'] as const,
  schedules: () => [...visitKeys.all, 'schedule'] as const,
  schedule: (query: object) => [...visitKeys.schedules(), query] as const,
  detail: (visitId: string) => [...visitKeys.all, 'detail', visitId] as const,
  version: (visitId: string, version: number) => [...visitKeys.detail(visitId), 'version', version] as const,
};

export const speciesKeys = {
  all: ['species'] as const,
  search: (query: object) => [...speciesKeys.all, query] as const,
  detail: (speciesId: string) => [...speciesKeys.all, 'detail', speciesId] as const,
};

export const alertKeys = {
  all: ['alerts'] as const,
  list: (filters: object) => [...alertKeys.all, 'list', filters] as const,
  detail: (alertId: string) => [...alertKeys.all, 'detail', alertId] as const,
};

/** Staff and clients are both people: a status change touches both lists. */
export const peopleKeys = {
  all: ['people'] as const,
  staff: () => [...peopleKeys.all, 'staff'] as const,
  clients: () => [...peopleKeys.all, 'clients'] as const,
  invitations: () => [...peopleKeys.all, 'invitations'] as const,
};

export const onCallKeys = { all: ['on-call'] as const };
export const deliveryKeys = { failed: ['deliveries', 'failed'] as const };
/** The inbox and the preferences are apart, so a live event refreshes the one without reloading a form. */
export const notificationKeys = {
  all: ['notifications'] as const,
  inbox: ['notifications', 'inbox'] as const,
  preferences: ['notifications', 'preferences'] as const,
};

/** The company's audit trail, one entry per filter set. */
export const auditKeys = {
  all: ['audit'] as const,
  list: (filters: object) => [...auditKeys.all, 'list', filters] as const,
};

/** The signed-in person's calendar feed: whether it is on (its address is shown once, never read back). */
export const calendarKeys = {
  all: ['calendar-feed'] as const,
  status: () => [...calendarKeys.all, 'status'] as const,
};

/**
 * Care tips: the company's list and each tip for staff; the feeds owners read (all of one person's
 * tanks, or one tank) hang under `tipKeys.feeds()`, so a helpful mark or a send updates them all.
 */
export const tipKeys = {
  all: ['care-tips'] as const,
  lists: () => [...tipKeys.all, 'list'] as const,
  detail: (tipId: string) => [...tipKeys.all, 'detail', tipId] as const,
  reach: (tipId: string) => [...tipKeys.detail(tipId), 'reach'] as const,
  audienceCount: (audience: object) => [...tipKeys.all, 'audience-count', audience] as const,
  feeds: () => [...tipKeys.all, 'feed'] as const,
  feed: (tankId: string | null) => [...tipKeys.feeds(), tankId ?? 'all'] as const,
};

/**
 * Conversations: one thread per tank (its pages), the staff inbox and the unread counts in the
 * header. A live "conversation" event invalidates them all; only what is on screen refetches.
 */
export const conversationKeys = {
  all: ['conversations'] as const,
  thread: (tankId: string) => [...conversationKeys.all, 'thread', tankId] as const,
  summary: (tankId: string) => [...conversationKeys.all, 'summary', tankId] as const,
  inbox: (query: object) => [...conversationKeys.all, 'inbox', query] as const,
  unread: () => [...conversationKeys.all, 'unread'] as const,
};

/** Urgent visit requests: the staff board, each request, a tank's requests and the company's settings. */
export const urgentKeys = {
  all: ['urgent-requests'] as const,
  board: (query: object) => [...urgentKeys.all, 'board', query] as const,
  detail: (requestId: string) => [...urgentKeys.all, 'detail', requestId] as const,
  tank: (tankId: string) => [...urgentKeys.all, 'tank', tankId] as const,
  settings: () => ['urgent-settings'] as const,
};

/**
 * The company's price list (billing settings and items): admins edit it, technicians pick the
 * consumables and parts used on a visit report from it. The urgent settings carry its call-out fee.
 */
export const billingKeys = {
  all: ['billing'] as const,
  priceList: () => [...billingKeys.all, 'price-list'] as const,
};

/**
 * Invoices and credit notes: the lists (one per filter set, the owner's own included) and each
 * document. A change to one document can move its totals, its related documents and every list, so
 * changes invalidate `invoiceKeys.all`.
 */
export const invoiceKeys = {
  all: ['invoices'] as const,
  lists: () => [...invoiceKeys.all, 'list'] as const,
  list: (filters: object) => [...invoiceKeys.lists(), filters] as const,
  detail: (invoiceId: string) => [...invoiceKeys.all, 'detail', invoiceId] as const,
};
