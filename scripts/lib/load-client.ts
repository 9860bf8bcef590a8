// autocannon in its own process (started by load-generator.ts), so that the load does not share
// the measured server's event loop. Reads LoadOptions as JSON from argv[2]; prints one JSON line.
import autocannon, { type Request } from 'autocannon';
import type { LoadOptions } from './load-generator';

const options = JSON.parse(process.argv[2] ?? '{}') as LoadOptions;
let written = 0;
const reads = options.readPaths.map((path) => ({ method: 'GET' as const, path, headers: { cookie: options.reader } }));
const write = options.writer && {
  method: 'POST' as const,
  path: '/api/suppliers',
  headers: { cookie: options.writer.cookie, 'x-csrf-token': options.writer.csrf, 'content-type': 'application/json' },
  setupRequest: (request: Request): Request => ({
    ...request,
    body: JSON.stringify({
      name: `Load writer ${process.pid}-${written++}`,
      country: 'Nowhere',
      approval: 'approved',
      reason: 'written under load',
    }),
  }),
};
const requests: Request[] = write && options.writeEvery ? [...reads.slice(0, options.writeEvery - 1), write] : reads;
const result = await autocannon({
  url: options.url,
  connections: options.connections,
  duration: options.duration,
  requests,
});
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
