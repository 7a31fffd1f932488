/** Shown wherever someone may be about to reach into the tank or under the cabinet. */
export function ElectricalCaution() {
  return (
    <div
      role="note"
      aria-label="Electrical safety"
      className="rounded-lg border-l-4 border-alert-700 bg-alert-100 p-4 text-sm text-ink-950"
    >
      <p className="flex items-center gap-2 font-bold text-alert-700">
        <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
          <path d="M9.5 1 3 9h4l-1 6 6.5-8h-4z" fill="currentColor" />
        </svg>
        Water and electricity: switch off first
      </p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        <li>
          Switch the equipment off at the wall or at its outlet on the board before putting hands in the tank
          or touching anything wet.
        </li>
        <li>Dry your hands before you touch a plug, switch or board. Never pull a plug by its cable.</li>
        <li>Keep a drip loop in every cable so water runs off below the socket, not into it.</li>
        <li>
          A board that trips, a scorch mark or a warm plug is for a licensed electrician, working to your
          local codes — do not reset it repeatedly.
        </li>
      </ul>
    </div>
  );
}
