import { useEffect, useState } from 'react';

/** The current time, ticking every `everyMs`, so "5 minutes ago" stays true on a screen left open. */
export function useNow(everyMs = 30_000): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = window.setInterval(() => setNow(Date.now()), everyMs);
    return () => window.clearInterval(timer);
  }, [everyMs]);
  return now;
}
