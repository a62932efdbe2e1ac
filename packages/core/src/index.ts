export * from './roles';
export * from './api/common';
export * from './api/rinks';
export * from './api/me';
export * from './api/staff';
export * from './api/auth';
export * from './api/platform';
