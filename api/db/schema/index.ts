export * from './companies';
export * from './invitations';
export * from './sessions';
export * from './tanks';
export * from './users';
