// The raw client, for the auth library's adapter, the migrator, the seed and test set-up.
// Feature code must not import this file (enforced by lint and by tests/architecture).
export { currentDb, createDbHandle, transaction, type Database, type DbHandle, type Executor } from './client';
