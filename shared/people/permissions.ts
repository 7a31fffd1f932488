/**
 * Who may do what, by role: the one table both the API's policy module and the client's
 * `can(me, permission)` read, so a button is shown exactly when the request behind it is allowed.
 */

export const roles = ['owner', 'technician', 'admin'] as const;
export type Role = (typeof roles)[number];

export const staffRoles = ['technician', 'admin'] as const;
export type StaffRole = (typeof staffRoles)[number];

const everyone: readonly Role[] = roles;
const staff: readonly Role[] = staffRoles;
const admins: readonly Role[] = ['admin'];
const owners: readonly Role[] = ['owner'];

export const permissions = {
  'me:read': everyone,
  'tanks:read': everyone,
  'tanks:write': staff,
  'clients:read': staff,
  'staff:read': admins,
  'staff:manage': admins,
  'invitations:manage': admins,
  'readings:read': everyone,
  // Owners record home tests on their own tanks; the readings service checks the source.
  'readings:write': everyone,
  // Readings taken at a service visit; owners record home tests only.
  'readings:record-visit': staff,
  'limits:read': everyone,
  'limits:write': staff,
  'devices:manage': staff,
  'alerts:read': everyone,
  'alerts:manage': staff,
  'notifications:own': everyone,
  'on-call:read': staff,
  'on-call:manage': admins,
  'equipment:write': staff,
  'livestock:write': staff,
  'species:read': everyone,
  'species:write': staff,
  'photos:read': everyone,
  'photos:write': staff,
  'audit:read': admins,
  // Owners read published visit reports and the next visit of their own tanks.
  'visits:read': everyone,
  // Schedule visits and write reports; giving a visit to another technician is for admins.
  'visits:write': staff,
  'visits:assign': admins,
  // Everyone can subscribe to their own schedule as a calendar feed.
  'calendar:own': everyone,
  // Owners read the tips their tanks received and mark them helpful; staff write and send them.
  'care-tips:read': everyone,
  'care-tips:write': staff,
  // A conversation per tank between its owners and the staff; internal notes and the inbox are staff-only.
  'conversations:read': everyone,
  'conversations:write': everyone,
  'conversations:notes': staff,
  'conversations:inbox': staff,
  // Owners ask for urgent visits (staff may file one for a client who phoned); staff move them on.
  'urgent:request': everyone,
  'urgent:read': everyone,
  'urgent:manage': staff,
  'urgent:settings': admins,
  /** The price list: staff read it (consumables on a visit report); admins set it. */
  'billing:read': staff,
  'billing:manage': admins,
  /** Owners read the invoices of their own tanks; staff read every invoice of the company. */
  'invoices:read': everyone,
  'invoices:manage': admins,
  /** Paying online: an owner pays their own invoice (staff never pay for a client). */
  'invoices:pay': owners,
  'invoices:export': admins,
} satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof permissions;

export function roleCan(role: Role, permission: Permission): boolean {
  return permissions[permission].includes(role);
}

export const isStaffRole = (role: Role): role is StaffRole => role !== 'owner';
