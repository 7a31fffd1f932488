import type { Role } from '@shared/people/permissions';

/**
 * The invented demo scenario's people. The identity-provider stand-in keeps them as its own
 * accounts (it knows nothing of the app's database); the seed links them to companies and tanks.
 * Every name and address is made up; `.test` is a reserved domain (RFC 2606).
 */
export const demoPassword = 'brine-demo-2026';

export interface DemoPerson {
  sub: string;
  email: string;
  name: string;
  role: Role;
  company: 'driftglass' | 'northpool';
}

export const demoPeople: readonly DemoPerson[] = [
  {
    sub: 'u-mara',
    email: 'mara@driftglass.test',
    name: 'Mara Okonkwo-Hale',
    role: 'admin',
    company: 'driftglass',
  },
  {
    sub: 'u-tomas',
    email: 'tomas@driftglass.test',
    name: 'Tomas Lindqvist',
    role: 'technician',
    company: 'driftglass',
  },
  {
    sub: 'u-priya',
    email: 'priya@driftglass.test',
    name: 'Priya Raman',
    role: 'technician',
    company: 'driftglass',
  },
  {
    sub: 'u-helen',
    email: 'helen@ashdown-home.test',
    name: 'Helen Ashdown',
    role: 'owner',
    company: 'driftglass',
  },
  {
    sub: 'u-felix',
    email: 'felix@quayside-dental.test',
    name: 'Felix Marchetti',
    role: 'owner',
    company: 'driftglass',
  },
  {
    sub: 'u-rosa',
    email: 'rosa@saltfig-kitchen.test',
    name: 'Rosa Delgado',
    role: 'owner',
    company: 'driftglass',
  },
  {
    sub: 'u-sam',
    email: 'sam@ferrous-studio.test',
    name: 'Sam Whitlock',
    role: 'owner',
    company: 'driftglass',
  },
  {
    sub: 'u-ingrid',
    email: 'ingrid@northpool.test',
    name: 'Ingrid Vale',
    role: 'admin',
    company: 'northpool',
  },
];
