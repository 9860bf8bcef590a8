// The load generator for npm run test:load, in its own process so that it does not share the
// server's event loop. Reads its options as JSON from argv[2]; prints one JSON line.
import autocannon, { type Request } from 'autocannon';

interface Options {
  url: string;
  connections: number;
  duration: number;
  reader: string;
  writer: { cookie: string; csrf: string };
  readPaths: string[];
  /** One write in every `writeEvery` requests (0: reads only). */
  writeEvery: number;
}

const options = JSON.parse(process.argv[2] ?? '{}') as Options;
let written = 0;
const reads = options.readPaths.map((path) => ({ method: 'GET' as const, path, headers: { cookie: options.reader } }));
const write = {
  method: 'POST' as const,
  path: '/api/suppliers',
  headers: { cookie: options.writer.cookie, 'x-csrf-token': options.writer.csrf, 'content-type': 'application/json' },
  setupRequest: (request: Request): Request => ({
    ...request,
    body: JSON.stringify({ name: `Load writer ${process.pid}-${written++}`, country: 'Nowhere', approval: 'approved', reason: 'written under load' }),
  }),
};
const requests: Request[] = options.writeEvery > 0 ? [...reads.slice(0, options.writeEvery - 1), write] : reads;
const result = await autocannon({ url: options.url, connections: options.connections, duration: options.duration, requests });
process.stdout.write(
  `${JSON.stringify({
    requests: result.requests.total,
    requestsPerSecond: Math.round(result.requests.average),
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    errors: result.errors,
    timeouts: result.timeouts,
    non2xx: result.non2xx,
    statusCodes: result.statusCodeStats,
  })}\n`,
);
