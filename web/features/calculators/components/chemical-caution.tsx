/** The caution shown wherever a calculation leads someone to handle dosing chemicals. */
export function ChemicalCaution() {
  return (
    <div className="rounded-lg border-l-4 border-watch-700 bg-watch-100 p-4 text-sm text-ink-950">
      <p className="flex items-center gap-2 font-bold text-watch-700">
        <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
          <path d="M8 1 15 14H1z" fill="currentColor" />
          <path d="M8 6v4M8 11.5v1" className="stroke-watch-100" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        Handle dosing chemicals with care
      </p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        <li>Dose according to the product’s label.</li>
        <li>Wear gloves and eye protection.</li>
        <li>Never mix concentrates with each other.</li>
        <li>Change readings gradually; test before each further dose.</li>
      </ul>
      <p className="mt-2">Brinewatch’s advice is general — ask your service company about your tank.</p>
    </div>
  );
}
