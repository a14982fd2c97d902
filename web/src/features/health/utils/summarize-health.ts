import { isApiError } from '../../../lib/api-client';
import type { HealthResponse } from '../api/get-health';

const GATEWAY_STATUSES = new Set([502, 503, 504]);

export type ServiceState = 'checking' | 'up' | 'down' | 'unknown';

export type HealthSummary = {
  overall: 'checking' | 'ok' | 'database-down' | 'unreachable';
  api: ServiceState;
  database: ServiceState;
  /** The latest report, when the server gave one. */
  report?: HealthResponse;
  /** Why the server could not be asked, in words for the screen. */
  problem?: string;
};

type HealthQueryState = {
  status: 'pending' | 'error' | 'success';
  data: HealthResponse | undefined;
  error: unknown;
};

/**
 * Turns the health query into what the screen shows. An answer of any kind means the server is up;
 * no answer (or one we cannot read) means we know nothing about the database either.
 */
export function summarizeHealth({ status, data, error }: HealthQueryState): HealthSummary {
  if (status === 'pending') return { overall: 'checking', api: 'checking', database: 'checking' };

  if (status === 'error' || !data) {
    return { overall: 'unreachable', api: 'down', database: 'unknown', problem: describeFailure(error) };
  }

  const isDatabaseUp = data.database.status === 'up';
  return {
    overall: isDatabaseUp ? 'ok' : 'database-down',
    api: 'up',
    database: isDatabaseUp ? 'up' : 'down',
    report: data,
  };
}

function describeFailure(error: unknown): string {
  if (!isApiError(error)) return 'The check could not be run.';
  if (error.status === 0) return error.message;
  // A gateway status without our report means whatever sits in front of the API got no answer from it.
  if (GATEWAY_STATUSES.has(error.status)) return `The server is not answering (HTTP ${error.status}).`;
  return `The server answered with an error (HTTP ${error.status}).`;
}
