import { useSyncExternalStore } from 'react';

function subscribe(onChange: () => void) {
  window.addEventListener('online', onChange);
  window.addEventListener('offline', onChange);
  return () => {
    window.removeEventListener('online', onChange);
    window.removeEventListener('offline', onChange);
  };
}

const isOnline = () => navigator.onLine;

/**
 * Whether the browser believes it has a network. `false` is reliable (no connection at all); `true`
 * only means some network is up, not that Brinewatch answers, so requests still handle failure.
 */
export function useOnline(): boolean {
  return useSyncExternalStore(subscribe, isOnline);
}
