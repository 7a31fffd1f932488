/**
 * What the bench seed writes, shared with the benches that look its people and devices up.
 * Everything here is invented bench data.
 */

/** Bumped whenever the data below changes shape: a different marker makes the seed start over. */
export const seedVersion = 1;

export const benchScale = (() => {
  const raw = process.env.BENCH_SCALE;
  if (raw === undefined || raw === '') return 1;
  const scale = Number(raw);
  if (!(scale > 0 && scale <= 1)) throw new Error(`BENCH_SCALE must be a number in (0, 1], not "${raw}"`);
  return scale;
})();

const scaled = (count: number, least: number) => Math.max(least, Math.round(count * benchScale));

/**
 * The identity provider stand-in the benches start listens here, so the seeded people (whose
 * issuer this is) can sign in through it.
 */
export const benchIssuer = 'http://127.0.0.1:39017';
export const benchPassword = 'bench-password-7c1f0e';

export type BenchCompany = 'a' | 'b' | 'c' | 'd';

export interface CompanyPlan {
  key: BenchCompany;
  name: string;
  tanks: number;
  /** Tanks 1..n carry a device with a year of 5-minute readings. */
  deviceHistoryTanks: number;
  /** Tanks 1..n carry a device for the alert-latency bench; the rest one for the ingest bench. */
  alertTanks: number;
  /** Every tank without device history gets weekly home tests. */
  homeTests: boolean;
}

export const tanksPerTechnician = 50;
export const ownersPerTank = 2;

/** Three sizes of the same business (2,000 / 500 / 50 tanks) and one company the write benches use. */
export const companyPlans: readonly CompanyPlan[] = [
  {
    key: 'a',
    name: 'Bench Aquatics A',
    tanks: scaled(2000, 20),
    deviceHistoryTanks: scaled(50, 2),
    alertTanks: 0,
    homeTests: true,
  },
  {
    key: 'b',
    name: 'Bench Aquatics B',
    tanks: scaled(500, 5),
    deviceHistoryTanks: 0,
    alertTanks: 0,
    homeTests: true,
  },
  {
    key: 'c',
    name: 'Bench Aquatics C',
    tanks: scaled(50, 3),
    deviceHistoryTanks: 0,
    alertTanks: 0,
    homeTests: true,
  },
  {
    key: 'd',
    name: 'Bench Aquatics D (devices)',
    tanks: 220,
    deviceHistoryTanks: 0,
    alertTanks: 20,
    homeTests: false,
  },
];

export const companySlug = (key: BenchCompany) => `bench-${key}`;
export const deviceParameters = ['temperature', 'ph', 'salinity'] as const;
export const historyDays = 365;

/** A device's bearer token: the ingest route wants 20–200 of [A-Za-z0-9_-]. */
export const deviceToken = (company: BenchCompany, tankNumber: number) =>
  `bwd_bench-${company}-${String(tankNumber).padStart(4, '0')}-device-token`;

export const personSubject = (company: BenchCompany, role: 'admin' | 'technician' | 'owner', n: number) =>
  `bench-${company}-${role}-${n}`;
export const personEmail = (company: BenchCompany, role: 'admin' | 'technician' | 'owner', n: number) =>
  `${role}-${n}@bench-${company}.test`;
