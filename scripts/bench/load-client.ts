// The load generator for the trace benchmark, in its own process so that it does not share the
// measured server's event loop. Reads its options as JSON from argv[2]; prints autocannon's
// summary as one JSON line.
import autocannon from 'autocannon';

const options = JSON.parse(process.argv[2] ?? '{}') as { url: string; connections: number; duration: number; cookie: string; paths: string[] };
const result = await autocannon({
  url: options.url,
  connections: options.connections,
  duration: options.duration,
  headers: { cookie: options.cookie },
  requests: options.paths.map((path) => ({ method: 'GET' as const, path })),
});
process.stdout.write(`${JSON.stringify({ requestsPerSecond: Math.round(result.requests.average), p99Ms: result.latency.p99, errors: result.errors + result.non2xx })}\n`);
