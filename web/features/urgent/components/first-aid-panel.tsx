import { useId } from 'react';
import { Link } from 'react-router';
import { StatusShape } from '../../../components/status-badges';
import {
  licensedPracticeNote,
  urgentCategoryNames,
  type FirstAid,
  type UrgentCategory,
} from '@shared/urgent/categories';

/** Categories where the next step is often "switch off the right outlet". */
const needsOutletMap: readonly UrgentCategory[] = ['leak', 'power', 'equipment'];

/**
 * What to do while help is on the way, and what never to do: the company's steps in order, the
 * safety cautions marked by a shape and a word as well as colour, and the limit of general advice.
 */
export function FirstAidPanel({
  category,
  firstAid,
  powerBoardHref,
  headingLevel = 2,
}: {
  category: UrgentCategory;
  firstAid: FirstAid;
  /** The tank's power-board map, offered where switching off an outlet is part of the answer. */
  powerBoardHref?: string;
  headingLevel?: 2 | 3;
}) {
  const id = useId();
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  const SubHeading = headingLevel === 2 ? 'h3' : 'h4';
  return (
    <section
      aria-labelledby={`${id}-title`}
      className="min-w-0 rounded-card border-2 border-ink-800 bg-white p-4 shadow-card sm:p-6"
    >
      <Heading id={`${id}-title`} className="text-lg font-bold text-ink-900 sm:text-xl">
        First aid while you wait: {urgentCategoryNames[category].label.toLowerCase()}
      </Heading>
      <div
        role="note"
        aria-labelledby={`${id}-cautions`}
        className="mt-3 rounded-lg border-l-8 border-alert-700 bg-alert-100 p-3 sm:p-4"
      >
        <SubHeading
          id={`${id}-cautions`}
          className="flex items-center gap-2 text-base font-bold text-alert-700 uppercase"
        >
          <StatusShape tone="alert" className="h-6 w-6" />
          Safety first
        </SubHeading>
        <ul className="mt-2 space-y-2 text-ink-950">
          {firstAid.cautions.map((caution) => (
            <li key={caution} className="flex gap-2">
              <span aria-hidden="true" className="mt-0.5 font-bold text-alert-700">
                !
              </span>
              <span className="font-bold">{caution}</span>
            </li>
          ))}
        </ul>
      </div>
      <SubHeading className="mt-4 font-bold text-ink-900">What to do now</SubHeading>
      <ol className="mt-2 space-y-2">
        {firstAid.steps.map((step, index) => (
          <li key={step} className="flex gap-3 text-ink-950">
            <span
              aria-hidden="true"
              className="flex h-7 w-7 shrink-0 items-center justify-center rounded-full bg-ink-800 text-sm font-bold text-white"
            >
              {index + 1}
            </span>
            <span className="pt-0.5">{step}</span>
          </li>
        ))}
      </ol>
      {powerBoardHref && needsOutletMap.includes(category) && (
        <p className="mt-3">
          <Link to={powerBoardHref} className="inline-flex min-h-11 items-center font-bold text-brine-700">
            Open the tank’s power board map to find the right outlet
          </Link>
        </p>
      )}
      <p className="mt-3 flex gap-2 rounded-lg bg-sand-100 p-3 text-sm text-ink-900">
        <span
          aria-hidden="true"
          className="flex h-5 w-5 shrink-0 items-center justify-center rounded-full border-2 border-ink-700 text-xs font-bold"
        >
          i
        </span>
        <span>{licensedPracticeNote}</span>
      </p>
    </section>
  );
}
