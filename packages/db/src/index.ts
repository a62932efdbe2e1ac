// What feature code may use. The unscoped client lives in '@rinkwright/db/unscoped' and is not for features.
export * from './schema/index';
export { preparedInsert, preparedJoined, preparedUpdate, qualified, scoped, reportScope, step, type RowOf, type PreparedJoined, type Scope, type RinkSettings, type Step } from './scope';
export { connectDb, connectReportsDb, disconnectDb, disconnectReportsDb, isDuplicateKey, pingDb } from './client';
export * as directory from './directory';
export * as platform from './platform';
export { isTenantTable, checkTenancy, GLOBAL_TABLES } from './tenancy';
