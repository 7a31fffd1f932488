import { z } from 'zod';

/**
 * What the audit trail records (OWASP ASVS 5.0 V16: authentication outcomes, changes of access and
 * of settings, data leaving the system, deletions). Names are `thing.what-happened`.
 */
export const auditActions = [
  'sign-in.succeeded',
  'sign-in.failed',
  'user.role-changed',
  'user.deactivated',
  'user.reactivated',
  'invitation.sent',
  'invitation.accepted',
  'invitation.revoked',
  'device.created',
  'device.revoked',
  'limits.changed',
  'readings.exported',
  'photo.deleted',
  'urgent-settings.changed',
  'billing-settings.changed',
  'invoice.issued',
  'invoice.voided',
  'invoice.credited',
  'invoice.payment-recorded',
] as const;
export const auditAction = z.enum(auditActions);
export type AuditAction = z.infer<typeof auditAction>;

export const auditActionLabels: Readonly<Record<AuditAction, string>> = {
  'sign-in.succeeded': 'Signed in',
  'sign-in.failed': 'Sign-in refused',
  'user.role-changed': 'Changed a role',
  'user.deactivated': 'Deactivated an account',
  'user.reactivated': 'Reactivated an account',
  'invitation.sent': 'Sent an invitation',
  'invitation.accepted': 'Accepted an invitation',
  'invitation.revoked': 'Withdrew an invitation',
  'device.created': 'Added a device',
  'device.revoked': 'Revoked a device',
  'limits.changed': 'Changed limits',
  'readings.exported': 'Downloaded readings',
  'photo.deleted': 'Deleted a photo',
  'urgent-settings.changed': 'Changed urgent visit settings',
  'billing-settings.changed': 'Changed billing settings',
  'invoice.issued': 'Issued an invoice',
  'invoice.voided': 'Cancelled an invoice',
  'invoice.credited': 'Issued a credit note',
  'invoice.payment-recorded': 'Recorded a payment',
};

/** What an entry is about. */
export const auditTargetKinds = ['user', 'invitation', 'device', 'tank', 'photo', 'invoice'] as const;
export const auditTargetKind = z.enum(auditTargetKinds);
export type AuditTargetKind = z.infer<typeof auditTargetKind>;

export const auditTargetKindLabels: Readonly<Record<AuditTargetKind, string>> = {
  user: 'Person',
  invitation: 'Invitation',
  device: 'Device',
  tank: 'Tank',
  photo: 'Photo',
  invoice: 'Invoice',
};
