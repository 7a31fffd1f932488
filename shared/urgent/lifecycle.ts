/*
 * An urgent visit request's life: asked for, acknowledged with an arrival estimate, given to a
 * technician, on the way, on site, then resolved (with the urgent visit's report) or declined (with
 * a reason and advice). Only the moves below are allowed; any other is refused with 409.
 */

export const urgentStatuses = [
  'requested',
  'acknowledged',
  'assigned',
  'on-the-way',
  'on-site',
  'resolved',
  'declined',
] as const;
export type UrgentStatus = (typeof urgentStatuses)[number];

/** Where each status may go next. Reassigning keeps "assigned"; declining is allowed until someone is on site. */
export const urgentTransitions: Readonly<Record<UrgentStatus, readonly UrgentStatus[]>> = {
  requested: ['acknowledged', 'declined'],
  acknowledged: ['assigned', 'declined'],
  assigned: ['assigned', 'on-the-way', 'declined'],
  'on-the-way': ['on-site'],
  'on-site': ['resolved'],
  resolved: [],
  declined: [],
};

export function canMove(from: UrgentStatus, to: UrgentStatus): boolean {
  return urgentTransitions[from].includes(to);
}

export const openUrgentStatuses = urgentStatuses.filter((s) => s !== 'resolved' && s !== 'declined');

export const urgentStatusNames: Readonly<Record<UrgentStatus, string>> = {
  requested: 'Requested',
  acknowledged: 'Acknowledged',
  assigned: 'Technician assigned',
  'on-the-way': 'On the way',
  'on-site': 'On site',
  resolved: 'Resolved',
  declined: 'Declined',
};

/** How long the company aims to take to acknowledge a request, unless it sets its own. */
export const defaultAckTargetMinutes = 30;
