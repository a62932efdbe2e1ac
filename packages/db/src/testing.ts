export * from './factories';
export { runMigrations } from './migrate';
