// The two reads every list request makes (its session, its page) straight through the MariaDB
// driver on a pooled connection: Sequelize's query path (replacement formatting, result handling,
// a type-cast callback per value) costs more than the small query itself on the busiest routes.
// Same pool; errors keep the driver's codes, which the error
// handler maps (a lost connection is a 503 like any other).
import type { Sequelize } from 'sequelize';

interface DriverConnection {
  query(sql: string | { sql: string; typeCast?: unknown }, values?: unknown[]): Promise<unknown[]>;
}
interface PoolManager {
  getConnection(options: { type: string; useMaster?: boolean }): Promise<DriverConnection>;
  releaseConnection(connection: DriverConnection): Promise<void> | void;
}

/** `?` placeholders; an array value stands for a list (`IN (?)`), expanded here. */
export async function plainSelect<T>(sequelize: Sequelize, sql: string, values: unknown[] = []): Promise<T[]> {
  let text = sql;
  let flat = values;
  if (values.some(Array.isArray)) {
    let i = 0;
    flat = [];
    text = sql.replace(/\?/g, () => {
      const v = values[i++];
      if (!Array.isArray(v)) {
        flat.push(v);
        return '?';
      }
      flat.push(...(v.length ? v : [null]));
      return v.length ? v.map(() => '?').join(', ') : '?';
    });
  }
  const manager = sequelize.connectionManager as unknown as PoolManager;
  const connection = await manager.getConnection({ type: 'SELECT' });
  try {
    // Without Sequelize's per-value type cast (a callback for every column of every row): these
    // reads take numbers, strings and JSON text as the driver gives them.
    return (await connection.query({ sql: text, typeCast: undefined }, flat)) as T[];
  } finally {
    await manager.releaseConnection(connection);
  }
}
