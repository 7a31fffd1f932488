import { useMemo } from 'react';
import { renderMarkdown } from '@shared/text/markdown';

/**
 * Markdown that people wrote (visit notes, care tips), styled by the `.md` block in styles.css.
 * The only place the client sets HTML: renderMarkdown escapes raw HTML and lets through only
 * allowed link addresses and our own photos (tests/shared/text/markdown.test.ts).
 */
export function Markdown({
  source,
  className = '',
  topHeading,
}: {
  source: string;
  className?: string;
  /** The level the text's biggest heading becomes: one below the heading it sits under. */
  topHeading?: 3 | 4 | 5 | 6;
}) {
  const html = useMemo(() => renderMarkdown(source, topHeading ? { topHeading } : {}), [source, topHeading]);
  return <div className={`md ${className}`} dangerouslySetInnerHTML={{ __html: html }} />;
}
