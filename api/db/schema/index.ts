export * from './companies';
export * from './users';
