import { integrationEnv } from '../support/env';
import { recreateDatabase } from '../support/fresh-database';

/** Once per integration run: a fresh database with every migration applied; refused unless it ends in _test. */
export default async function setup(): Promise<void> {
  await recreateDatabase(integrationEnv().DATABASE_URL, '_test');
}
