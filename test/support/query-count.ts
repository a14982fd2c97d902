import pg from 'pg';

/**
 * Counts the SQL statements the API sends through node-postgres while `work` runs (the test app and
 * the test share one process). For asserting a fixed number of queries (no N+1). The queues' own
 * polling (pg-boss) runs on timers in the same process, on its own named connections, and is not counted.
 */
export async function withQueryCount(work: () => Promise<unknown>): Promise<number> {
  const prototype = pg.Client.prototype as unknown as { query: (...args: unknown[]) => unknown };
  const original = prototype.query;
  let count = 0;
  prototype.query = function (this: { connectionParameters?: { application_name?: string } }, ...args: unknown[]) {
    // The queues' connections are named 'loamline-queue' (see common/pg-boss-queue.ts).
    if (this.connectionParameters?.application_name !== 'loamline-queue') count += 1;
    return original.apply(this, args);
  };
  try {
    await work();
  } finally {
    prototype.query = original;
  }
  return count;
}
