import autocannon from 'autocannon';

export interface LoadTarget {
  /** A short label for the printout. */
  name: string;
  url: string;
  method?: 'GET' | 'POST';
  headers?: Record<string, string>;
  body?: string;
}

export interface LoadFigures {
  name: string;
  connections: number;
  requests: number;
  ok2xx: number;
  non2xx: number;
  errors: number;
  timeouts: number;
  requestsPerSecond: number;
  p50Ms: number;
  p99Ms: number;
  durationS: number;
  /** True when the time cap stopped the run before it made every request it was asked for. */
  isCapped: boolean;
}

/**
 * Fires `amount` requests (when given; otherwise runs for `seconds`) at `target` over `connections`
 * keep-alive connections with autocannon, and returns its counts and latency percentiles. A run with
 * `amount` is still stopped after `seconds`, so a slow server cannot hold a test up.
 */
export async function runLoad(
  target: LoadTarget,
  { connections = 50, amount, seconds = 30 }: { connections?: number; amount?: number; seconds?: number },
): Promise<LoadFigures> {
  const started = performance.now();
  let isCapped = false;
  // autocannon returns its run tracker: thenable (the result) and stoppable (the types show only the promise).
  const instance = autocannon({
    url: target.url,
    method: target.method ?? 'GET',
    headers: target.headers,
    body: target.body,
    connections,
    ...(amount ? { amount } : { duration: seconds }),
    timeout: 20,
  }) as unknown as Promise<autocannon.Result> & { stop(): void };
  const cap = amount
    ? setTimeout(() => {
        isCapped = true;
        instance.stop();
      }, seconds * 1000)
    : undefined;
  const result = await instance;
  clearTimeout(cap);
  return {
    name: target.name,
    connections,
    requests: result.requests.total,
    ok2xx: result['2xx'],
    non2xx: result.non2xx,
    errors: result.errors,
    timeouts: result.timeouts,
    requestsPerSecond: Math.round(result.requests.average),
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    durationS: Math.round((performance.now() - started) / 100) / 10,
    isCapped,
  };
}

/** One printable line per run. */
export function formatLoad(f: LoadFigures): string {
  return `${f.name.padEnd(28)} ${String(f.requests).padStart(6)} req  ${String(f.requestsPerSecond).padStart(6)} req/s  p50 ${String(f.p50Ms).padStart(5)} ms  p99 ${String(f.p99Ms).padStart(5)} ms  non-2xx ${f.non2xx}  errors ${f.errors}`;
}
