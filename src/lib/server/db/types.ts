import type { PgDatabase } from 'drizzle-orm/pg-core';
import type { PostgresJsQueryResultHKT } from 'drizzle-orm/postgres-js';
import type * as schema from './schema';

/** The database or a transaction on it: what domain services accept so callers choose the scope. */
export type Executor = PgDatabase<PostgresJsQueryResultHKT, typeof schema>;
