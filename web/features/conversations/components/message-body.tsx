import { useMemo } from 'react';
import { linkSegments } from '../utils/link-segments';

/**
 * A message's text as typed (line breaks kept), with addresses made into links. Built from React
 * elements, so whatever someone types stays text.
 */
export function MessageBody({ text }: { text: string }) {
  const segments = useMemo(() => linkSegments(text, window.location.origin), [text]);
  return (
    <p className="whitespace-pre-wrap [overflow-wrap:anywhere] text-ink-950">
      {segments.map((segment, index) =>
        segment.kind === 'text' ? (
          segment.text
        ) : segment.external ? (
          <a
            key={index}
            href={segment.href}
            target="_blank"
            rel="noopener noreferrer"
            className="font-bold text-brine-700 underline"
          >
            {segment.text}
            <span className="sr-only"> (opens in a new tab)</span>
          </a>
        ) : (
          <a key={index} href={segment.href} className="font-bold text-brine-700 underline">
            {segment.text}
          </a>
        ),
      )}
    </p>
  );
}
