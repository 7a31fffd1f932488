/*
 * The kinds of service visit and the states of one, with the words people see. Plain values
 * without zod (the request schemas build their enums from these), so a screen that only shows a
 * visit's kind or state does not load the validator.
 */

export const visitKinds = [
  'routine',
  'aquascaping',
  'equipment',
  'livestock',
  'installation',
  'urgent',
] as const;
export type VisitKind = (typeof visitKinds)[number];

export const visitKindLabels: Readonly<Record<VisitKind, string>> = {
  routine: 'Routine service',
  aquascaping: 'Aquascaping',
  equipment: 'Equipment work',
  livestock: 'Livestock work',
  installation: 'Installation',
  urgent: 'Urgent visit',
};

/** scheduled → in progress (a report was started) → published; a planned visit can be cancelled. */
export const visitStatuses = ['scheduled', 'in-progress', 'published', 'cancelled'] as const;
export type VisitStatus = (typeof visitStatuses)[number];

export const visitStatusLabels: Readonly<Record<VisitStatus, string>> = {
  scheduled: 'Scheduled',
  'in-progress': 'Report started',
  published: 'Report published',
  cancelled: 'Cancelled',
};
