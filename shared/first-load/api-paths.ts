/*
 * The addresses (under /api) of the reads a page makes while it draws its first screen. The
 * client's fetchers build their URLs here and the server names the same ones in the page's HTML
 * as preloads (./routes.ts): a preload that differs by one character, a parameter's order
 * included, is not reused but fetched a second time.
 */

/** The alert list's filters, always written in this order, whichever order a screen names them in. */
const alertFilterOrder = ['tankId', 'status', 'severity'] as const;
export type AlertListFilters = Partial<Record<(typeof alertFilterOrder)[number], string>>;

/** What a tank's summary asks for: its alerts in every state, and its three newest care tips. */
export const tankSummaryAlertStatus = 'all';
export const tankSummaryTipLimit = 3;

export const apiPaths = {
  health: () => '/health',
  me: () => '/me',
  unreadMessages: () => '/conversations/unread',
  notifications: () => '/notifications',
  tanks: () => '/tanks',
  tank: (tankId: string) => `/tanks/${tankId}`,
  latestReadings: (tankId: string) => `/tanks/${tankId}/readings/latest`,
  tankVisits: (tankId: string) => `/tanks/${tankId}/visits`,
  tankConversation: (tankId: string) => `/tanks/${tankId}/conversation`,
  tankUrgentRequests: (tankId: string) => `/tanks/${tankId}/urgent-requests`,
  alerts: (filters: AlertListFilters) => {
    const query = new URLSearchParams();
    for (const key of alertFilterOrder) {
      const value = filters[key];
      if (value) query.set(key, value);
    }
    return query.size > 0 ? `/alerts?${query}` : '/alerts';
  },
  tipFeed: ({ tankId, cursor, limit }: { tankId: string | null; cursor: string | null; limit: number }) => {
    const query = new URLSearchParams({ limit: String(limit) });
    if (tankId) query.set('tankId', tankId);
    if (cursor) query.set('cursor', cursor);
    return `/care-tips/feed?${query}`;
  },
};
