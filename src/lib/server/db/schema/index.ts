export * from './users';
export * from './workspaces';
export * from './audit';
export * from './auth';
export * from './invitations';
