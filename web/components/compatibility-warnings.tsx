import type { CompatibilityWarning } from '@shared/livestock/compatibility';

const kindLabels: Record<CompatibilityWarning['kind'], string> = {
  'water-type': 'Wrong water',
  'stings-neighbours': 'Stings neighbours',
  wanders: 'Moves around',
  'nips-corals': 'Nips corals',
  'nips-clams': 'Nips clams',
  'eats-invertebrates': 'Eats invertebrates',
  'eats-fish': 'Eats fish',
  territorial: 'Territorial',
  'care-range': 'Different water needs',
};

/** Why an addition may go wrong, worst first; "serious" and "caution" are words and shapes, not only colour. */
export function CompatibilityWarnings({ warnings }: { warnings: readonly CompatibilityWarning[] }) {
  return (
    <ul className="space-y-2" aria-label="Compatibility warnings">
      {warnings.map((warning, index) => {
        const serious = warning.severity === 'serious';
        return (
          <li
            key={`${warning.kind}-${index}`}
            className={`rounded-lg border-l-4 p-3 text-sm ${serious ? 'border-alert-700 bg-alert-100' : 'border-watch-700 bg-watch-100'}`}
          >
            <p
              className={`flex items-center gap-2 font-bold ${serious ? 'text-alert-700' : 'text-watch-700'}`}
            >
              <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
                {serious ? (
                  <path d="M5 1h6l4 4v6l-4 4H5l-4-4V5z" fill="currentColor" />
                ) : (
                  <path d="M8 1 15 14H1z" fill="currentColor" />
                )}
              </svg>
              {serious ? 'Serious' : 'Caution'}: {kindLabels[warning.kind]}
            </p>
            <p className="mt-1 text-ink-950">{warning.message}</p>
          </li>
        );
      })}
    </ul>
  );
}
