/*
 * The demo's photos, drawn here as SVG and rendered with sharp: simple scenes of a tank and
 * portraits of what lives in it. Nothing is downloaded; every shape and colour is our own.
 */
import type { TankStyle } from '@shared/parameters/limit-templates';
import { tankStyleWaterType } from '@shared/parameters/limit-templates';

/** A small deterministic generator, so a drawing comes out the same on every seed. */
function randomFrom(seedText: string) {
  let state = 2166136261;
  for (const char of seedText) state = Math.imul(state ^ char.charCodeAt(0), 16777619);
  return () => {
    state = Math.imul(state ^ (state >>> 15), 2246822507);
    state = Math.imul(state ^ (state >>> 13), 3266489909);
    state ^= state >>> 16;
    return (state >>> 0) / 4294967296;
  };
}

const round = (n: number) => Math.round(n * 10) / 10;

interface FishLook {
  body: string;
  belly?: string;
  fin: string;
  stripes?: { colour: string; count: number; edge?: string };
  /** Length to height: 2.6 for a slim tetra, 1.3 for a disc-shaped tang. */
  aspect: number;
  spots?: string;
  lateralLine?: string;
  spines?: string;
  /** A dark wedge on the rear half of the body. */
  wedge?: string;
}

export const fishLooks: Record<string, FishLook> = {
  'ocellaris-clownfish': {
    body: '#f27a1a',
    fin: '#f59a45',
    stripes: { colour: '#ffffff', count: 3, edge: '#1b1b1b' },
    aspect: 2,
  },
  'green-chromis': { body: '#6fd3c4', belly: '#b9f0e2', fin: '#8ee0d3', aspect: 2.1 },
  'yellow-tang': { body: '#f5d327', fin: '#f0c419', aspect: 1.3 },
  'blue-tang': { body: '#2f63d6', fin: '#1c3f99', stripes: { colour: '#10204a', count: 1 }, aspect: 1.8 },
  'volitans-lionfish': {
    body: '#e9d3c0',
    fin: '#c8553d',
    stripes: { colour: '#9b2f1f', count: 7 },
    aspect: 2.1,
    spines: '#b84a33',
  },
  'niger-triggerfish': { body: '#2c2f86', fin: '#4a5bd1', aspect: 1.7, lateralLine: '#6b7cff' },
  'foxface-rabbitfish': { body: '#f2c230', fin: '#e8b21c', aspect: 1.8 },
  'yellow-watchman-goby': { body: '#f2d54b', fin: '#e8c230', spots: '#5fa6d9', aspect: 3 },
  'neon-tetra': { body: '#c9d4dc', belly: '#e5474b', fin: '#dfe8ee', lateralLine: '#3ad1ff', aspect: 2.8 },
  'harlequin-rasbora': { body: '#f0a47a', fin: '#f5b892', aspect: 2.4, wedge: '#2a1a1a' },
  'bristlenose-pleco': { body: '#6b5640', fin: '#57452f', spots: '#e8dcc2', aspect: 2.6 },
};

let fishCount = 0;

function fish(look: FishLook, x: number, y: number, length: number, flip = false): string {
  const h = length / look.aspect;
  const half = h / 2;
  const tail = length * 0.28;
  const body =
    `M0 0 C${round(length * 0.15)} ${round(-half * 1.1)} ${round(length * 0.7)} ${round(-half * 1.05)} ${round(length * 0.82)} 0 ` +
    `C${round(length * 0.7)} ${round(half * 1.05)} ${round(length * 0.15)} ${round(half * 1.1)} 0 0Z`;
  const tailFin = `M${round(length * 0.8)} 0 L${round(length * 0.8 + tail)} ${round(-half * 0.8)} Q${round(length * 0.8 + tail * 0.7)} 0 ${round(length * 0.8 + tail)} ${round(half * 0.8)}Z`;
  const dorsal = `M${round(length * 0.25)} ${round(-half * 0.85)} Q${round(length * 0.45)} ${round(-half * 1.7)} ${round(length * 0.68)} ${round(-half * 0.6)}Z`;
  const parts = [`<path d="${tailFin}" fill="${look.fin}"/>`, `<path d="${dorsal}" fill="${look.fin}"/>`];
  if (look.spines) {
    for (let i = 0; i < 9; i++) {
      const angle = -150 + i * 16;
      const rad = (angle * Math.PI) / 180;
      const sx = length * 0.4;
      parts.push(
        `<line x1="${round(sx)}" y1="0" x2="${round(sx + Math.cos(rad) * length * 0.75)}" y2="${round(Math.sin(rad) * length * 0.75)}" stroke="${look.spines}" stroke-width="${round(length * 0.02)}" stroke-linecap="round"/>`,
      );
    }
  }
  parts.push(`<path d="${body}" fill="${look.body}"/>`);
  const marks: string[] = [];
  if (look.belly) {
    marks.push(
      `<path d="M${round(length * 0.12)} ${round(half * 0.2)} C${round(length * 0.3)} ${round(half * 0.9)} ${round(length * 0.65)} ${round(half * 0.85)} ${round(length * 0.8)} ${round(half * 0.1)} Z" fill="${look.belly}"/>`,
    );
  }
  if (look.lateralLine) {
    marks.push(
      `<path d="M${round(length * 0.12)} ${round(-half * 0.15)} L${round(length * 0.8)} ${round(-half * 0.1)}" stroke="${look.lateralLine}" stroke-width="${round(h * 0.14)}" stroke-linecap="round"/>`,
    );
  }
  if (look.stripes) {
    const { colour, count, edge } = look.stripes;
    for (let i = 0; i < count; i++) {
      const sx = length * (0.2 + (0.55 * (i + 0.5)) / count);
      const width = length * (count > 3 ? 0.035 : 0.07);
      const stripe = `<rect x="${round(sx - width / 2)}" y="${round(-half * 1.1)}" width="${round(width)}" height="${round(h * 1.1)}" rx="${round(width / 2)}" fill="${colour}"${edge ? ` stroke="${edge}" stroke-width="${round(width * 0.22)}"` : ''}/>`;
      marks.push(stripe);
    }
  }
  if (look.spots) {
    for (let i = 0; i < 6; i++) {
      marks.push(
        `<circle cx="${round(length * (0.3 + (i % 3) * 0.14))}" cy="${round(-half * 0.35 + Math.floor(i / 3) * half * 0.55)}" r="${round(h * 0.06)}" fill="${look.spots}"/>`,
      );
    }
  }
  if (look.wedge) {
    marks.push(
      `<path d="M${round(length * 0.42)} ${round(-half)} L${round(length * 0.84)} 0 L${round(length * 0.42)} ${round(half * 0.7)}Z" fill="${look.wedge}"/>`,
    );
  }
  const clipId = `fish-body-${(fishCount += 1)}`;
  parts.push(
    `<clipPath id="${clipId}"><path d="${body}"/></clipPath>`,
    `<g clip-path="url(#${clipId})">${marks.join('')}</g>`,
  );
  parts.push(
    `<circle cx="${round(length * 0.13)}" cy="${round(-half * 0.18)}" r="${round(h * 0.11)}" fill="#ffffff"/>`,
    `<circle cx="${round(length * 0.12)}" cy="${round(-half * 0.18)}" r="${round(h * 0.065)}" fill="#0b1a22"/>`,
  );
  const transform = flip
    ? `translate(${round(x)} ${round(y)}) scale(-1 1)`
    : `translate(${round(x)} ${round(y)})`;
  return `<g transform="${transform}">${parts.join('')}</g>`;
}

function water(id: string, top: string, bottom: string, width: number, height: number): string {
  return (
    `<defs><linearGradient id="${id}" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${top}"/><stop offset="1" stop-color="${bottom}"/></linearGradient></defs>` +
    `<rect width="${width}" height="${height}" fill="url(#${id})"/>`
  );
}

function lightRays(width: number, height: number, random: () => number): string {
  return Array.from({ length: 5 }, (_, i) => {
    const x = width * (0.1 + i * 0.2 + random() * 0.05);
    return `<path d="M${round(x)} 0 L${round(x + 60)} 0 L${round(x + 220)} ${height} L${round(x + 120)} ${height}Z" fill="#ffffff" opacity="0.06"/>`;
  }).join('');
}

function bubbles(width: number, height: number, random: () => number): string {
  return Array.from({ length: 14 }, () => {
    const r = 3 + random() * 6;
    return `<circle cx="${round(width * (0.82 + random() * 0.1))}" cy="${round(height * random() * 0.8)}" r="${round(r)}" fill="none" stroke="#e8f4f2" stroke-width="1.5" opacity="0.7"/>`;
  }).join('');
}

function rock(cx: number, base: number, w: number, h: number, colour: string): string {
  return `<path d="M${round(cx - w / 2)} ${base} C${round(cx - w * 0.45)} ${round(base - h * 0.7)} ${round(cx - w * 0.2)} ${round(base - h)} ${round(cx)} ${round(base - h * 0.95)} C${round(cx + w * 0.25)} ${round(base - h * 1.05)} ${round(cx + w * 0.48)} ${round(base - h * 0.6)} ${round(cx + w / 2)} ${base}Z" fill="${colour}"/>`;
}

function branchingCoral(x: number, base: number, size: number, colour: string, random: () => number): string {
  const branches = Array.from({ length: 5 }, (_, i) => {
    const angle = -150 + i * 30 + random() * 10;
    const rad = (angle * Math.PI) / 180;
    const ex = x + Math.cos(rad) * size;
    const ey = base + Math.sin(rad) * size;
    return `<path d="M${x} ${base} Q${round((x + ex) / 2 + 10)} ${round((base + ey) / 2)} ${round(ex)} ${round(ey)}" stroke="${colour}" stroke-width="${round(size * 0.14)}" stroke-linecap="round" fill="none"/>`;
  });
  return branches.join('');
}

function polyps(
  x: number,
  y: number,
  count: number,
  spread: number,
  rim: string,
  centre: string,
  random: () => number,
): string {
  return Array.from({ length: count }, () => {
    const px = x + (random() - 0.5) * spread;
    const py = y + (random() - 0.5) * spread * 0.5;
    const r = 10 + random() * 8;
    return `<circle cx="${round(px)}" cy="${round(py)}" r="${round(r)}" fill="${rim}"/><circle cx="${round(px)}" cy="${round(py)}" r="${round(r * 0.45)}" fill="${centre}"/>`;
  }).join('');
}

function anemone(
  x: number,
  base: number,
  size: number,
  tentacle: string,
  tip: string,
  random: () => number,
): string {
  const arms = Array.from({ length: 22 }, (_, i) => {
    const angle = -175 + i * (170 / 21) + (random() - 0.5) * 6;
    const rad = (angle * Math.PI) / 180;
    const len = size * (0.75 + random() * 0.3);
    const ex = x + Math.cos(rad) * len;
    const ey = base + Math.sin(rad) * len;
    return (
      `<path d="M${x} ${base} Q${round(x + Math.cos(rad) * len * 0.5 + 8)} ${round(base + Math.sin(rad) * len * 0.5)} ${round(ex)} ${round(ey)}" stroke="${tentacle}" stroke-width="${round(size * 0.09)}" stroke-linecap="round" fill="none"/>` +
      `<circle cx="${round(ex)}" cy="${round(ey)}" r="${round(size * 0.075)}" fill="${tip}"/>`
    );
  });
  return `<ellipse cx="${x}" cy="${round(base + 6)}" rx="${round(size * 0.45)}" ry="${round(size * 0.14)}" fill="#8a5a4a"/>${arms.join('')}`;
}

function hammerHeads(x: number, base: number, size: number, colour: string, random: () => number): string {
  return Array.from({ length: 6 }, (_, i) => {
    const angle = -160 + i * 28 + random() * 8;
    const rad = (angle * Math.PI) / 180;
    const ex = x + Math.cos(rad) * size;
    const ey = base + Math.sin(rad) * size;
    return Array.from({ length: 6 }, (_, j) => {
      const t = (angle + 90) * (Math.PI / 180);
      const ox = Math.cos(t) * (j - 2.5) * size * 0.06;
      const oy = Math.sin(t) * (j - 2.5) * size * 0.06;
      return `<path d="M${x} ${base} L${round(ex + ox)} ${round(ey + oy)}" stroke="${colour}" stroke-width="${round(size * 0.05)}" stroke-linecap="round" opacity="0.85"/><circle cx="${round(ex + ox)}" cy="${round(ey + oy)}" r="${round(size * 0.05)}" fill="#d8f07a"/>`;
    }).join('');
  }).join('');
}

function leatherCoral(x: number, base: number, size: number, random: () => number): string {
  const cap = `<path d="M${round(x - size)} ${round(base - size * 0.8)} C${round(x - size * 0.6)} ${round(base - size * 1.35)} ${round(x + size * 0.6)} ${round(base - size * 1.35)} ${round(x + size)} ${round(base - size * 0.8)} C${round(x + size * 0.5)} ${round(base - size * 0.6)} ${round(x - size * 0.5)} ${round(base - size * 0.6)} ${round(x - size)} ${round(base - size * 0.8)}Z" fill="#d9c48f"/>`;
  const stalk = `<path d="M${round(x - size * 0.22)} ${base} L${round(x - size * 0.3)} ${round(base - size * 0.75)} L${round(x + size * 0.3)} ${round(base - size * 0.75)} L${round(x + size * 0.22)} ${base}Z" fill="#c9b27a"/>`;
  const tufts = Array.from({ length: 40 }, () => {
    const px = x + (random() - 0.5) * size * 1.7;
    const py = base - size * (0.9 + random() * 0.25);
    return `<circle cx="${round(px)}" cy="${round(py)}" r="2.5" fill="#f5ecd0"/>`;
  }).join('');
  return stalk + cap + tufts;
}

function plant(
  x: number,
  base: number,
  height: number,
  colour: string,
  random: () => number,
  leaves = 7,
): string {
  return Array.from({ length: leaves }, (_, i) => {
    const lean = (i - (leaves - 1) / 2) * 22 + (random() - 0.5) * 10;
    const h = height * (0.7 + random() * 0.35);
    const tipX = x + lean * 2.2;
    return `<path d="M${x} ${base} Q${round(x + lean * 0.4 - 18)} ${round(base - h * 0.6)} ${round(tipX)} ${round(base - h)} Q${round(x + lean * 0.4 + 18)} ${round(base - h * 0.5)} ${x} ${base}Z" fill="${colour}" opacity="0.92"/>`;
  }).join('');
}

function shrimp(x: number, y: number, size: number): string {
  const body = `M${x} ${y} C${round(x + size * 0.3)} ${round(y - size * 0.28)} ${round(x + size * 0.75)} ${round(y - size * 0.22)} ${round(x + size * 0.95)} ${round(y + size * 0.05)} C${round(x + size * 0.7)} ${round(y + size * 0.02)} ${round(x + size * 0.3)} ${round(y + size * 0.12)} ${x} ${round(y + size * 0.1)}Z`;
  const legs = Array.from({ length: 5 }, (_, i) => {
    const lx = x + size * (0.2 + i * 0.12);
    return `<path d="M${round(lx)} ${round(y + size * 0.05)} l${round(-size * 0.04)} ${round(size * 0.16)}" stroke="#f4f4f4" stroke-width="3" stroke-linecap="round"/>`;
  }).join('');
  return (
    `<path d="M${x} ${round(y - size * 0.02)} q${round(-size * 0.5)} ${round(-size * 0.45)} ${round(-size * 0.95)} ${round(-size * 0.15)} M${x} ${round(y + size * 0.02)} q${round(-size * 0.45)} ${round(-size * 0.6)} ${round(-size * 0.85)} ${round(-size * 0.5)}" stroke="#f5f5f5" stroke-width="3" fill="none"/>` +
    legs +
    `<path d="${body}" fill="#d8332f"/>` +
    `<path d="M${round(x + size * 0.04)} ${round(y - size * 0.04)} C${round(x + size * 0.35)} ${round(y - size * 0.26)} ${round(x + size * 0.72)} ${round(y - size * 0.2)} ${round(x + size * 0.9)} ${round(y + size * 0.02)}" stroke="#ffffff" stroke-width="${round(size * 0.045)}" stroke-linecap="round" fill="none"/>` +
    `<path d="M${round(x + size * 0.92)} ${round(y + size * 0.03)} l${round(size * 0.16)} ${round(-size * 0.12)} l${round(size * 0.02)} ${round(size * 0.24)}z" fill="#d8332f"/>` +
    `<circle cx="${round(x + size * 0.06)}" cy="${round(y - size * 0.02)}" r="${round(size * 0.035)}" fill="#0b1a22"/>`
  );
}

function torchCoral(x: number, base: number, size: number, random: () => number): string {
  return Array.from({ length: 26 }, (_, i) => {
    const angle = -170 + i * 6.2 + (random() - 0.5) * 5;
    const rad = (angle * Math.PI) / 180;
    const len = size * (0.7 + random() * 0.35);
    const ex = x + Math.cos(rad) * len;
    const ey = base + Math.sin(rad) * len;
    return `<path d="M${x} ${base} Q${round(x + Math.cos(rad) * len * 0.5 + 15)} ${round(base + Math.sin(rad) * len * 0.55)} ${round(ex)} ${round(ey)}" stroke="#7fa86a" stroke-width="${round(size * 0.05)}" stroke-linecap="round" fill="none"/><circle cx="${round(ex)}" cy="${round(ey)}" r="${round(size * 0.04)}" fill="#f2e45c"/>`;
  }).join('');
}

const sandBed = (width: number, height: number, colour: string) =>
  `<path d="M0 ${round(height * 0.84)} Q${round(width * 0.25)} ${round(height * 0.8)} ${round(width * 0.5)} ${round(height * 0.85)} T${width} ${round(height * 0.83)} V${height} H0Z" fill="${colour}"/>`;

/** A view of the whole tank for its cover photo, in the style of what it keeps. */
export function tankSceneSvg(key: string, style: TankStyle, width = 1200, height = 800): string {
  const random = randomFrom(key);
  const fresh = tankStyleWaterType[style] === 'fresh';
  const layers: string[] = [];
  layers.push(
    fresh ? water('w', '#4fa39a', '#1d5a4f', width, height) : water('w', '#2f8fce', '#0b3a66', width, height),
  );
  layers.push(lightRays(width, height, random));
  if (fresh) {
    layers.push(
      `<path d="M${round(width * 0.3)} ${round(height * 0.86)} C${round(width * 0.38)} ${round(height * 0.55)} ${round(width * 0.5)} ${round(height * 0.5)} ${round(width * 0.62)} ${round(height * 0.3)}" stroke="#5b3b22" stroke-width="34" stroke-linecap="round" fill="none"/>`,
    );
    layers.push(sandBed(width, height, '#8d7a5b'));
    const greens = ['#3f9a3a', '#58b847', '#2f7d35', '#7fcf5a'];
    for (let i = 0; i < 9; i++) {
      layers.push(
        plant(
          width * (0.06 + i * 0.11),
          height * 0.88,
          height * (style === 'planted-freshwater' ? 0.55 : 0.35),
          greens[i % greens.length]!,
          random,
        ),
      );
    }
    const school =
      style === 'planted-freshwater' ? fishLooks['harlequin-rasbora']! : fishLooks['neon-tetra']!;
    for (let i = 0; i < 9; i++) {
      layers.push(
        fish(
          school,
          width * (0.3 + random() * 0.45),
          height * (0.25 + random() * 0.35),
          54 + random() * 10,
          random() > 0.5,
        ),
      );
    }
  } else {
    layers.push(sandBed(width, height, '#e3d3ad'));
    layers.push(rock(width * 0.28, height * 0.86, width * 0.34, height * 0.38, '#8a7468'));
    layers.push(rock(width * 0.7, height * 0.86, width * 0.4, height * 0.46, '#7d695e'));
    layers.push(rock(width * 0.5, height * 0.87, width * 0.22, height * 0.2, '#6f5c53'));
    if (style === 'soft-lps-reef') {
      layers.push(leatherCoral(width * 0.3, height * 0.6, 70, random));
      layers.push(torchCoral(width * 0.72, height * 0.46, 110, random));
      layers.push(hammerHeads(width * 0.52, height * 0.72, 60, '#6fb0c9', random));
      layers.push(polyps(width * 0.82, height * 0.8, 8, 70, '#8a4fd1', '#55d0a0', random));
    } else if (style !== 'fish-only-marine') {
      layers.push(branchingCoral(width * 0.24, height * 0.56, 90, '#f39a7b', random));
      layers.push(anemone(width * 0.72, height * 0.44, 80, '#b5d67a', '#f28db2', random));
      layers.push(hammerHeads(width * 0.55, height * 0.7, 70, '#5aa36a', random));
      layers.push(polyps(width * 0.36, height * 0.5, 10, 80, '#f2994a', '#4ccf6b', random));
      layers.push(leatherCoral(width * 0.86, height * 0.84, 55, random));
    }
    const looks =
      style === 'fish-only-marine'
        ? ['volitans-lionfish', 'yellow-tang', 'blue-tang', 'niger-triggerfish', 'foxface-rabbitfish']
        : ['ocellaris-clownfish', 'ocellaris-clownfish', 'green-chromis', 'green-chromis', 'green-chromis'];
    looks.forEach((look, i) => {
      const size = style === 'fish-only-marine' ? 130 + random() * 40 : 70 + random() * 15;
      layers.push(
        fish(
          fishLooks[look]!,
          width * (0.12 + i * 0.17),
          height * (0.2 + random() * 0.22),
          size,
          i % 2 === 1,
        ),
      );
    });
  }
  layers.push(bubbles(width, height, random));
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${layers.join('')}</svg>`;
}

/** A close-up portrait of one inhabitant, drawn from its species. */
export function livestockPortraitSvg(speciesId: string, width = 900, height = 675): string {
  const random = randomFrom(speciesId);
  const fresh = ['neon-tetra', 'bristlenose-pleco', 'harlequin-rasbora', 'amazon-sword'].includes(speciesId);
  const layers: string[] = [
    fresh ? water('w', '#5fae9f', '#21564c', width, height) : water('w', '#3b9bd6', '#0d416f', width, height),
    lightRays(width, height, random),
    sandBed(width, height, fresh ? '#8d7a5b' : '#e3d3ad'),
  ];
  const cx = width / 2;
  const base = height * 0.84;
  const look = fishLooks[speciesId];
  if (look) {
    if (!fresh) layers.push(rock(width * 0.2, base, width * 0.36, height * 0.3, '#7d695e'));
    else
      layers.push(
        plant(width * 0.15, base + 10, height * 0.5, '#3f9a3a', random),
        plant(width * 0.85, base + 10, height * 0.45, '#58b847', random),
      );
    const length = look.aspect < 1.6 ? width * 0.36 : width * 0.46;
    layers.push(fish(look, cx - length * 0.45, height * 0.45, length));
    if (speciesId === 'ocellaris-clownfish')
      layers.push(fish(look, cx + width * 0.14, height * 0.24, length * 0.55, true));
  } else {
    switch (speciesId) {
      case 'bubble-tip-anemone':
        layers.push(
          rock(cx, base, width * 0.6, height * 0.25, '#7d695e'),
          anemone(cx, base - height * 0.2, height * 0.42, '#b5d67a', '#f28db2', random),
        );
        break;
      case 'hammer-coral':
        layers.push(
          rock(cx, base, width * 0.5, height * 0.18, '#7d695e'),
          hammerHeads(cx, base - height * 0.14, height * 0.42, '#5aa36a', random),
        );
        break;
      case 'zoanthids':
        layers.push(
          rock(cx, base, width * 0.8, height * 0.4, '#7d695e'),
          polyps(cx, base - height * 0.36, 34, width * 0.55, '#f2994a', '#4ccf6b', random),
        );
        break;
      case 'leather-coral':
        layers.push(leatherCoral(cx, base, width * 0.25, random));
        break;
      case 'torch-coral':
        layers.push(
          rock(cx, base, width * 0.5, height * 0.18, '#7d695e'),
          torchCoral(cx, base - height * 0.14, height * 0.5, random),
        );
        break;
      case 'skunk-cleaner-shrimp':
        layers.push(
          rock(cx, base, width * 0.8, height * 0.3, '#7d695e'),
          shrimp(cx - width * 0.15, height * 0.5, width * 0.32),
        );
        break;
      case 'amazon-sword':
        layers.push(plant(cx, base + 10, height * 0.7, '#3f9a3a', random, 11));
        break;
      default:
        layers.push(
          rock(cx, base, width * 0.6, height * 0.3, '#7d695e'),
          branchingCoral(cx, base - height * 0.25, height * 0.3, '#f39a7b', random),
        );
    }
  }
  layers.push(bubbles(width, height, random));
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${layers.join('')}</svg>`;
}
