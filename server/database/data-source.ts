import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Config } from '../config';
import { ENTITIES } from './entities';

/** The one DataSource shape the server, scripts and tests use; schema changes come only from migrations. */
export function createDataSource(db: Config['db']): DataSource {
  return new DataSource({
    type: 'postgres',
    host: db.host,
    port: db.port,
    database: db.name,
    username: db.user,
    password: db.password,
    entities: ENTITIES,
    migrations: [`${import.meta.dirname}/../migrations/*.{ts,js}`],
    migrationsTableName: 'schema_migrations',
    synchronize: false,
    // Short connect timeout so a stopped database turns into a quick 503, not a hung request.
    extra: { max: 10, connectionTimeoutMillis: 3000 },
  });
}
