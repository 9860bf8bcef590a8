// Load from a separate process: the benchmarks and npm run test:load run autocannon through
// load-client.ts, because a load generator in the server's own process halves what it measures.
import { execFile } from 'node:child_process';

export interface LoadOptions {
  url: string;
  connections: number;
  /** Seconds. */
  duration: number;
  /** The session cookie the reads are sent with. */
  reader: string;
  readPaths: string[];
  /** A signed-in writer, and one write (a new supplier) in every `writeEvery` requests. */
  writer?: { cookie: string; csrf: string };
  writeEvery?: number;
}

export interface LoadResult {
  requests: number;
  requestsPerSecond: number;
  p50Ms: number;
  p99Ms: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  statusCodes: Record<string, { count: number }>;
}

export function loadFromAnotherProcess(options: LoadOptions): Promise<LoadResult> {
  return new Promise((resolveLoad, rejectLoad) => {
    execFile(
      process.execPath,
      ['--import', 'tsx', 'scripts/lib/load-client.ts', JSON.stringify(options)],
      { maxBuffer: 1 << 20 },
      (error, stdout) => {
        if (error) return rejectLoad(error);
        resolveLoad(JSON.parse(stdout.trim().split('\n').at(-1)!) as LoadResult);
      },
    );
  });
}
