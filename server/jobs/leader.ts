import type { Sequelize, Transaction } from 'sequelize';
import { QueryTypes } from 'sequelize';

/**
 * Runs `work` only in the one process that holds the job's advisory lock for this transaction;
 * other instances skip the round. Returns null when another process had it.
 */
export async function asLeader<T>(sequelize: Sequelize, jobName: string, work: (t: Transaction) => Promise<T>): Promise<T | null> {
  return sequelize.transaction(async (transaction) => {
    const [row] = await sequelize.query<{ ok: boolean }>('SELECT pg_try_advisory_xact_lock(hashtext($1)) AS ok', {
      bind: [`parapet:${jobName}`],
      type: QueryTypes.SELECT,
      transaction,
    });
    return row?.ok ? work(transaction) : null;
  });
}
