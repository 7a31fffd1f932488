/** Drawn for Brinewatch: a cabinet tank with rockwork, a coral, a fish and a reading line. */
export function TankIllustration({ className = '' }: { className?: string }) {
  return (
    <svg viewBox="0 0 360 260" className={className} role="img" aria-labelledby="tank-art-title">
      <title id="tank-art-title">A reef tank on its cabinet with a steady reading line above it</title>
      <defs>
        <linearGradient id="tank-water" x1="0" y1="0" x2="0" y2="1">
          <stop offset="0" stopColor="#3fb8af" stopOpacity="0.55" />
          <stop offset="1" stopColor="#0f7f79" stopOpacity="0.9" />
        </linearGradient>
      </defs>
      <path
        d="M24 46 C70 30, 110 60, 150 42 S230 30, 270 44 S330 40, 340 34"
        fill="none"
        stroke="#a9c3c9"
        strokeWidth="3"
        strokeLinecap="round"
      />
      <circle cx="340" cy="34" r="6" fill="#3fb8af" stroke="#fff" strokeWidth="2" />
      <rect
        x="40"
        y="70"
        width="280"
        height="140"
        rx="10"
        fill="url(#tank-water)"
        stroke="#124452"
        strokeWidth="4"
      />
      <path d="M44 186 q40 -34 78 -10 q26 -30 60 -6 q36 -26 70 2 q30 -16 64 4 v30 h-272z" fill="#c9b89a" />
      <path
        d="M96 178 q4 -30 -10 -52 M96 178 q10 -24 28 -36 M96 178 q-2 -20 -22 -28"
        stroke="#f39a7b"
        strokeWidth="6"
        strokeLinecap="round"
        fill="none"
      />
      <path
        d="M226 168 q-6 -26 6 -44 M226 168 q12 -18 30 -22"
        stroke="#d9c46a"
        strokeWidth="6"
        strokeLinecap="round"
        fill="none"
      />
      <g transform="translate(180 118)">
        <path d="M0 0 q22 -16 44 0 q-22 16 -44 0z" fill="#f28c38" />
        <path d="M44 0 l12 -10 v20z" fill="#f28c38" />
        <path d="M14 -9 v18 M28 -10 v20" stroke="#fff" strokeWidth="4" />
        <circle cx="8" cy="-2" r="2" fill="#061c23" />
      </g>
      <circle cx="270" cy="100" r="5" fill="none" stroke="#e8f4f2" strokeWidth="2" />
      <circle cx="278" cy="86" r="3" fill="none" stroke="#e8f4f2" strokeWidth="2" />
      <rect x="30" y="210" width="300" height="40" rx="6" fill="#124452" />
      <rect x="46" y="220" width="128" height="22" rx="4" fill="#1d5a6a" />
      <rect x="186" y="220" width="128" height="22" rx="4" fill="#1d5a6a" />
    </svg>
  );
}
