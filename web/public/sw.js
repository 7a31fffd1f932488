/*
 * Brinewatch's service worker: shows alert notifications pushed by the server and opens the tank
 * when one is tapped. Plain script, no imports; the page registers it from /sw.js (scope /).
 * Payload: { alertId, tankId, severity, status, title, body, url }.
 */

self.addEventListener('install', () => {
  self.skipWaiting();
});

self.addEventListener('activate', (event) => {
  event.waitUntil(self.clients.claim());
});

function readPayload(event) {
  if (!event.data) return null;
  try {
    return event.data.json();
  } catch {
    return { title: 'Brinewatch', body: event.data.text() };
  }
}

self.addEventListener('push', (event) => {
  const payload = readPayload(event) || {};
  const critical = payload.severity === 'critical';
  const resolved = payload.status === 'resolved';
  const title = typeof payload.title === 'string' && payload.title ? payload.title : 'Brinewatch alert';
  const options = {
    body: typeof payload.body === 'string' ? payload.body : '',
    icon: '/favicon.svg',
    badge: '/favicon.svg',
    // One notification per alert: a later update (escalated, resolved) replaces the earlier one.
    tag: payload.alertId || undefined,
    // Ring again for news about the same alert, except the quiet news that it is over.
    renotify: Boolean(payload.alertId) && !resolved,
    requireInteraction: critical && !resolved,
    data: { url: typeof payload.url === 'string' ? payload.url : '/' },
  };
  event.waitUntil(self.registration.showNotification(title, options));
});

self.addEventListener('notificationclick', (event) => {
  event.notification.close();
  const target = new URL(event.notification.data?.url || '/', self.location.origin);
  if (target.origin !== self.location.origin) return;
  event.waitUntil(
    (async () => {
      const windows = await self.clients.matchAll({ type: 'window', includeUncontrolled: true });
      const same = windows.find((client) => client.url === target.href);
      if (same) return same.focus();
      for (const client of windows) {
        if (!('navigate' in client)) continue;
        try {
          const moved = await client.navigate(target.href);
          if (moved) return moved.focus();
        } catch {
          // A window this worker does not control cannot be navigated; open a new one instead.
        }
      }
      return self.clients.openWindow(target.href);
    })(),
  );
});

function urlBase64ToBytes(base64url) {
  const base64 = base64url.replace(/-/g, '+').replace(/_/g, '/');
  const binary = atob(base64.padEnd(Math.ceil(base64.length / 4) * 4, '='));
  return Uint8Array.from(binary, (char) => char.charCodeAt(0));
}

const jsonHeaders = {
  'content-type': 'application/json',
  accept: 'application/json',
  'x-requested-with': 'brinewatch',
};

/** The push service replaced the subscription: tell the server the new one and forget the old. */
self.addEventListener('pushsubscriptionchange', (event) => {
  event.waitUntil(
    (async () => {
      let fresh = event.newSubscription;
      if (!fresh) {
        const response = await fetch('/api/push/public-key', { credentials: 'same-origin' });
        if (!response.ok) return;
        const { publicKey } = await response.json();
        if (!publicKey) return;
        fresh = await self.registration.pushManager.subscribe({
          userVisibleOnly: true,
          applicationServerKey: urlBase64ToBytes(publicKey),
        });
      }
      await fetch('/api/push/subscriptions', {
        method: 'POST',
        credentials: 'same-origin',
        headers: jsonHeaders,
        body: JSON.stringify(fresh.toJSON()),
      });
      if (event.oldSubscription && event.oldSubscription.endpoint !== fresh.endpoint) {
        await fetch('/api/push/subscriptions', {
          method: 'DELETE',
          credentials: 'same-origin',
          headers: jsonHeaders,
          body: JSON.stringify({ endpoint: event.oldSubscription.endpoint }),
        });
      }
    })(),
  );
});
