import { useEffect, useRef } from 'react';
import { Link } from 'react-router';

export interface SectionLink {
  key: string;
  label: string;
  to: string;
}

/**
 * A page's sections as one row of links, each its own address so the browser's back button
 * steps between them. On a phone the row scrolls sideways inside itself and keeps the current
 * section in view; the page never does.
 */
export function SectionNav({
  label,
  sections,
  current,
}: {
  label: string;
  sections: readonly SectionLink[];
  current: string;
}) {
  const currentRef = useRef<HTMLAnchorElement>(null);
  useEffect(() => {
    currentRef.current?.scrollIntoView({ block: 'nearest', inline: 'nearest' });
  }, [current]);
  return (
    <nav aria-label={label} className="-mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
      <ul className="flex w-max gap-1 border-b-2 border-ink-100 sm:w-auto sm:flex-wrap">
        {sections.map((section) => {
          const active = section.key === current;
          return (
            <li key={section.key}>
              <Link
                ref={active ? currentRef : undefined}
                to={section.to}
                preventScrollReset
                aria-current={active ? 'page' : undefined}
                className={`-mb-0.5 inline-flex min-h-11 items-center whitespace-nowrap border-b-4 px-3 font-bold no-underline ${
                  active
                    ? 'border-brine-700 text-ink-950'
                    : 'border-transparent text-ink-700 hover:border-ink-300 hover:text-ink-950'
                }`}
              >
                {section.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
