export const onCallQueryKey = ['on-call'] as const;
export const failedDeliveriesQueryKey = ['deliveries', 'failed'] as const;
