/*
 * The one registration of /sw.js (scope /), which keeps the app shell for use without a connection
 * and receives web push. Push set-up asks for the same registration.
 */

let registering: Promise<ServiceWorkerRegistration> | undefined;

export function registerServiceWorker(): Promise<ServiceWorkerRegistration> {
  registering ??= navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch((error: unknown) => {
    registering = undefined;
    throw error;
  });
  return registering;
}

/**
 * The page's own scripts, styles and fonts load before a new worker controls it; naming them once the
 * worker is active lets it keep them, so even a first visit reopens without a connection.
 */
async function offerLoadedBuildFiles() {
  const registration = await navigator.serviceWorker.ready;
  const urls = performance
    .getEntriesByType('resource')
    .map((entry) => new URL(entry.name))
    .filter((url) => url.origin === window.location.origin && url.pathname.startsWith('/assets/'))
    .map((url) => url.href);
  registration.active?.postMessage({ type: 'keep-build-files', urls });
}

/**
 * Registers the worker on every page load of a production build, after the page has loaded so it
 * never competes with the first paint. Not under the Vite dev server: its modules change with every
 * edit and are not the hashed files the worker keeps.
 */
export function startServiceWorker() {
  // Browsers offer service workers only in secure contexts (https, or localhost).
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const start = () => {
    registerServiceWorker()
      .then(offerLoadedBuildFiles)
      .catch((error: unknown) => {
        // Online the app works without its worker; a developer may want to know why it is missing.
        console.warn('Brinewatch could not start its service worker', error);
      });
  };
  if (document.readyState === 'complete') start();
  else window.addEventListener('load', start, { once: true });
}
