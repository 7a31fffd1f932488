import { useEffect, useRef, useState, type RefObject } from 'react';
import { useMarkConversationRead } from '../api/mark-read';

/**
 * Marks the conversation read up to its newest line once that line has been on screen while the
 * page was in front: not when the thread merely loaded in a background tab, and once per line.
 */
export function useMarkReadWhenSeen({
  tankId,
  newestId,
  alreadyRead,
  newestRef,
}: {
  tankId: string;
  newestId: string | undefined;
  /** The server's read position already covers the newest line. */
  alreadyRead: boolean;
  newestRef: RefObject<HTMLElement | null>;
}) {
  const markRead = useMarkConversationRead(tankId);
  const { mutate } = markRead;
  const marked = useRef<string | null>(null);
  const [seenId, setSeenId] = useState<string | null>(null);
  const [visible, setVisible] = useState(() => document.visibilityState === 'visible');

  useEffect(() => {
    const onChange = () => setVisible(document.visibilityState === 'visible');
    document.addEventListener('visibilitychange', onChange);
    return () => document.removeEventListener('visibilitychange', onChange);
  }, []);

  useEffect(() => {
    const target = newestRef.current;
    if (!target || !newestId || typeof IntersectionObserver === 'undefined') return;
    const observer = new IntersectionObserver(
      (entries) => setSeenId(entries.some((entry) => entry.isIntersecting) ? newestId : null),
      { threshold: 0.5 },
    );
    observer.observe(target);
    return () => observer.disconnect();
  }, [newestId, newestRef]);

  useEffect(() => {
    if (!newestId || alreadyRead || seenId !== newestId || !visible || marked.current === newestId) return;
    marked.current = newestId;
    mutate(newestId, {
      // Tried again when the next line arrives or the page comes back to the front.
      onError: () => {
        marked.current = null;
      },
    });
  }, [alreadyRead, mutate, newestId, seenId, visible]);
}
