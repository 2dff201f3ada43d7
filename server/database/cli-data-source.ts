import { loadConfig } from '../config';
import { createDataSource } from './data-source';

/** For the TypeORM CLI only (e.g. `npx typeorm-ts-node-esm migration:generate`): it wants exactly one export. */
export default createDataSource(loadConfig().db);
