// Runs a group of simulated people against Gatewell with autocannon: a number of connections, each
// asking a shared schedule which person sends what next, every answer's route, status and latency
// recorded as it arrives.
import autocannon from 'autocannon';

/** One answer: which route, its status, and the latency autocannon measured (send to last byte), ms. */
export interface Sample {
  route: string;
  status: number;
  ms: number;
}

/** What a group saw: every answer, the requests that failed without one, and the wall time. */
export interface Tally {
  samples: Sample[];
  socketErrors: number;
  timeouts: number;
  seconds: number;
  /** The first few refused answers, for the report. */
  firstRefusals: string[];
}

/** The next request of the schedule: whose session sends it, where, and with what body. */
export interface ScheduledRequest {
  route: string;
  path: string;
  cookie: string;
  method?: 'GET' | 'POST';
  body?: Buffer;
  contentType?: string;
  /** Further request headers (a client-side navigation's RSC headers). */
  headers?: Record<string, string>;
}

export interface GroupOptions {
  baseUrl: string;
  connections: number;
  durationS: number;
  /** Requests per second per connection; 0 sends the next request as soon as the answer arrives. */
  ratePerConnection: number;
  timeoutS: number;
}

/** Whether an answer is refused: outside 2xx, except 304 for a body the browser's cache holds (a request without an answer has no status and is counted as a timeout or socket error instead). */
const refused = (status: number) => (status < 200 || status > 299) && status !== 304;

const delay = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * The entity tags each person's browser holds, by session and address: a browser keeps an answer that
 * carries an ETag (and no `no-store`) in its HTTP cache and, asked for the same address again, sends
 * If-None-Match with it; a 304 answer then serves the kept body. Gatewell's pages and navigations are
 * `no-store`; its plate wells and fits JSON carry tags (lib/plates/answer-tag.ts).
 */
const heldTags = new Map<string, string>();

function template(baseUrl: string, next: () => ScheduledRequest, tally: Tally): autocannon.Request {
  const origin = new URL(baseUrl).origin;
  return {
    setupRequest: (request, context) => {
      const scheduled = next();
      context.route = scheduled.route;
      const held = `${scheduled.cookie}\n${scheduled.path}`;
      context.held = held;
      const headers: Record<string, string> = { ...scheduled.headers, cookie: scheduled.cookie };
      const tag = (scheduled.method ?? 'GET') === 'GET' ? heldTags.get(held) : undefined;
      if (tag) headers['if-none-match'] = tag;
      if (scheduled.method === 'POST') headers.origin = origin;
      if (scheduled.contentType) headers['content-type'] = scheduled.contentType;
      return {
        ...request,
        method: scheduled.method ?? 'GET',
        path: scheduled.path,
        headers,
        ...(scheduled.body ? { body: scheduled.body } : {}),
      };
    },
    onResponse: (status, body, context, headers) => {
      const tag = headers?.etag;
      const store = !/no-store/i.test(String(headers?.['cache-control'] ?? ''));
      if (status === 200 && typeof tag === 'string' && store) heldTags.set(String(context.held), tag);
      if (refused(status) && tally.firstRefusals.length < 5)
        tally.firstRefusals.push(`${String(context.route)} ${status}: ${body.slice(0, 200)}`);
    },
  };
}

/**
 * Runs the group for the duration: one autocannon instance per connection, started evenly over the
 * first second so that paced connections do not all send at the same instant.
 */
export async function runGroup(next: () => ScheduledRequest, options: GroupOptions): Promise<Tally> {
  const tally: Tally = { samples: [], socketErrors: 0, timeouts: 0, seconds: 0, firstRefusals: [] };
  const started = performance.now();
  const runs = Array.from({ length: options.connections }, async (_, i) => {
    await delay((i * 1000) / options.connections);
    const instance = autocannon({
      url: options.baseUrl,
      connections: 1,
      duration: options.durationS,
      timeout: options.timeoutS,
      // Paced connections: autocannon's own histogram would add made-up answers for late ones; Gatewell keeps its own samples.
      ...(options.ratePerConnection > 0
        ? { connectionRate: options.ratePerConnection, ignoreCoordinatedOmission: true }
        : {}),
      requests: [template(options.baseUrl, next, tally)],
    });
    instance.on('response', (client, status, _bytes, ms) => {
      tally.samples.push({ route: String(client.requestIterator.context.route), status, ms });
    });
    const result = await instance;
    tally.timeouts += result.timeouts;
    tally.socketErrors += result.errors - result.timeouts;
  });
  await Promise.all(runs);
  tally.seconds = (performance.now() - started) / 1000;
  return tally;
}
