import type { HandlingHazard } from '@shared/livestock/species';

const headings: Record<HandlingHazard['hazard'], string> = {
  'contact-toxin': 'Toxic to touch: gloves and eye protection',
  irritant: 'Irritant: wear gloves',
  'venomous-spines': 'Venomous spines: never handle by hand',
  'sharp-spines': 'Sharp spines: handle with care',
  bite: 'Bites: keep fingers clear',
};

/** The caution for an animal or coral that can hurt whoever handles it. */
export function HandlingCaution({ hazard, compact = false }: { hazard: HandlingHazard; compact?: boolean }) {
  return (
    <div
      role="note"
      aria-label="Handling caution"
      className="rounded-lg border-l-4 border-watch-700 bg-watch-100 p-3 text-sm text-ink-950"
    >
      <p className="flex items-center gap-2 font-bold text-watch-700">
        <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
          <path d="M8 1 15 14H1z" fill="currentColor" />
          <path d="M8 6v4M8 11.5v1" stroke="#fbebd0" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        {headings[hazard.hazard]}
      </p>
      {!compact && <p className="mt-1">{hazard.caution}</p>}
    </div>
  );
}

/** Anemones sting even when the catalogue names no handling hazard for them. */
export const stingCaution: HandlingHazard = {
  hazard: 'irritant',
  caution: 'It stings. Wear gloves when you must touch it, and keep it away from your face and eyes.',
};
