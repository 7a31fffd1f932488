/*
 * Brinewatch's service worker. Plain script, no imports; web/lib/service-worker.ts registers it from
 * /sw.js (scope /) on every page load of a production build. Two jobs:
 * - the app shell opens without a connection (technicians write reports at the tank, often with a
 *   poor one): pages come from the network first, else from the last index.html kept; Vite's hashed
 *   build files and the icons come from the cache once fetched. /api and /auth are never touched:
 *   their answers belong to one person and one moment, and work not yet sent lives in the page's
 *   own store (web/lib/offline-store.ts), not here.
 * - shows alert notifications pushed by the server and opens the tank when one is tapped.
 *   Payload: { alertId, tankId, severity, status, title, body, url } for an alert, or
 *   { tag, tankId, title, body, url } for company news (a published visit report).
 */

// Raise the version when what is kept changes shape: activate then drops every older cache.
const cacheName = 'brinewatch-shell-v2';
const cachePrefix = 'brinewatch-';
const shellUrl = '/';
// A page that has not answered by then is shown from the kept shell instead (a few seconds is
// common practice); the network's answer, if it comes, still refreshes the kept copy.
const slowPageMs = 4000;

self.addEventListener('install', (event) => {
  event.waitUntil(
    (async () => {
      try {
        const response = await fetch(new Request(shellUrl, { cache: 'reload' }));
        if (isShell(response)) await keepShell(response);
      } catch {
        // Installed without a connection: push must work all the same, and the next page load keeps the shell.
      }
      await self.skipWaiting();
    })(),
  );
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    (async () => {
      const names = await caches.keys();
      await Promise.all(
        names
          .filter((name) => name.startsWith(cachePrefix) && name !== cacheName)
          .map((name) => caches.delete(name)),
      );
      await self.clients.claim();
    })(),
  );
});

function isUnder(pathname, folder) {
  return pathname === folder || pathname.startsWith(`${folder}/`);
}

/**
 * Files Vite names by their content (scripts, styles and the fonts it bundles): a name never changes
 * meaning, so a kept copy is always right.
 */
function isBuildFile(url) {
  return url.origin === self.location.origin && url.pathname.startsWith('/assets/');
}

/** Files from web/public: same name, new content after a release, so they are refreshed behind the kept copy. */
function isPublicFile(url) {
  return (
    url.pathname === '/favicon.svg' ||
    url.pathname === '/manifest.webmanifest' ||
    url.pathname.startsWith('/icons/')
  );
}

function isKeepable(response) {
  return response.status === 200 && response.type === 'basic';
}

function isShell(response) {
  return (
    isKeepable(response) &&
    !response.redirected &&
    (response.headers.get('content-type') || '').startsWith('text/html')
  );
}

/**
 * The server names the reads and the lazy module of the page asked for in its HTML, as links marked
 * `data-first-load`. The kept shell opens at any address, where another page's would be fetched
 * for nothing (and warned about as unused), so it is kept without them.
 */
async function keepShell(response) {
  const html = await response.text();
  const headers = new Headers(response.headers);
  // The body kept is the decoded text, of a new length.
  headers.delete('content-encoding');
  headers.delete('content-length');
  const shell = new Response(html.replace(/[ \t]*<link\b[^>]*\bdata-first-load\b[^>]*>\n?/g, ''), {
    status: response.status,
    statusText: response.statusText,
    headers,
  });
  const cache = await caches.open(cacheName);
  await cache.put(shellUrl, shell);
}

/**
 * Every app address answers with the same index.html (but for its first-load links), so the newest
 * one from any page is kept as the shell. The copy is taken before the page can start reading the body.
 */
function pageFromNetworkFirst(event) {
  const fromNetwork = fetch(event.request);
  event.waitUntil(
    fromNetwork
      .then(async (response) => {
        if (isShell(response)) await keepShell(response.clone());
      })
      .catch(() => undefined),
  );
  return (async () => {
    const cache = await caches.open(cacheName);
    const shell = await cache.match(shellUrl);
    if (!shell) return fromNetwork;
    let timer;
    const slow = new Promise((resolve) => {
      timer = setTimeout(resolve, slowPageMs, null);
    });
    try {
      return (await Promise.race([fromNetwork, slow])) || shell;
    } catch {
      return shell;
    } finally {
      clearTimeout(timer);
    }
  })();
}

async function fromCacheFirst(event) {
  const cache = await caches.open(cacheName);
  const kept = await cache.match(event.request);
  if (kept) return kept;
  const response = await fetch(event.request);
  if (isKeepable(response)) event.waitUntil(cache.put(event.request, response.clone()));
  return response;
}

async function keptThenRefreshed(event) {
  const cache = await caches.open(cacheName);
  const kept = await cache.match(event.request);
  const fresh = fetch(event.request).then(async (response) => {
    if (isKeepable(response)) await cache.put(event.request, response.clone());
    return response;
  });
  if (!kept) return fresh;
  event.waitUntil(fresh.catch(() => undefined));
  return kept;
}

self.addEventListener('fetch', (event) => {
  const { request } = event;
  if (request.method !== 'GET') return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  if (isUnder(url.pathname, '/api') || isUnder(url.pathname, '/auth')) return;
  if (request.mode === 'navigate') event.respondWith(pageFromNetworkFirst(event));
  else if (isBuildFile(url)) event.respondWith(fromCacheFirst(event));
  else if (isPublicFile(url)) event.respondWith(keptThenRefreshed(event));
});

/**
 * A first visit loads its files before this worker controls the page, so the page names them once
 * the worker is ready (web/lib/service-worker.ts) and they are kept like any later build file.
 */
self.addEventListener('message', (event) => {
  const message = event.data;
  if (!message || message.type !== 'keep-build-files' || !Array.isArray(message.urls)) return;
  const urls = message.urls
    .filter((href) => typeof href === 'string')
    .map((href) => new URL(href, self.location.origin))
    .filter(isBuildFile);
  event.waitUntil(
    (async () => {
      const cache = await caches.open(cacheName);
      for (const url of urls) {
        if (await cache.match(url)) continue;
        try {
          const response = await fetch(url);
          if (isKeepable(response)) await cache.put(url, response);
        } catch {
          // Gone offline meanwhile: this file is kept the next time it is fetched.
        }
      }
    })(),
  );
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
    tag: payload.alertId || (typeof payload.tag === 'string' ? payload.tag : undefined),
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
