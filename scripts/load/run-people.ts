// Runs simulated people against Gatewell with autocannon: one connection (and one session) per person,
// each answer's route, status and latency recorded as it arrives.
import autocannon from 'autocannon';

/** One answer: which route, its status, and the latency autocannon measured (send to last byte), ms. */
export interface Sample {
  route: string;
  status: number;
  ms: number;
}

/** What a group of people saw: every answer, the requests that failed without one, and the wall time. */
export interface Tally {
  samples: Sample[];
  socketErrors: number;
  timeouts: number;
  seconds: number;
  /** The first few refused answers, for the report. */
  firstRefusals: string[];
}

export interface Person {
  cookie: string;
  requests: autocannon.Request[];
}

export interface GroupOptions {
  baseUrl: string;
  durationS: number;
  /** Requests per second per person; 0 sends the next request as soon as the answer arrives. */
  ratePerPerson: number;
  timeoutS: number;
  /** Delay between one person's start and the next, ms (spreads paced people over the second). */
  staggerMs: number;
}

const delay = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

function withSession(request: autocannon.Request, cookie: string, tally: Tally): autocannon.Request {
  return {
    ...request,
    headers: { ...request.headers, cookie },
    onResponse: (status, body) => {
      if ((status < 200 || status > 299) && tally.firstRefusals.length < 5) tally.firstRefusals.push(`${request.route} ${status}: ${body.slice(0, 200)}`);
    },
  };
}

/** Runs every person for the duration, starting them `staggerMs` apart, and tallies what they saw. */
export async function runPeople(people: Person[], options: GroupOptions): Promise<Tally> {
  const tally: Tally = { samples: [], socketErrors: 0, timeouts: 0, seconds: 0, firstRefusals: [] };
  const started = performance.now();
  const runs = people.map(async (person, i) => {
    await delay(i * options.staggerMs);
    const instance = autocannon({
      url: options.baseUrl,
      connections: 1,
      duration: options.durationS,
      timeout: options.timeoutS,
      // Paced people: autocannon's own histogram would add made-up answers for late ones; Gatewell keeps its own samples.
      ...(options.ratePerPerson > 0 ? { connectionRate: options.ratePerPerson, ignoreCoordinatedOmission: true } : {}),
      requests: person.requests.map((request) => withSession(request, person.cookie, tally)),
    });
    instance.on('response', (client, status, _bytes, ms) => {
      tally.samples.push({ route: client.requestIterator.currentRequest.route ?? '?', status, ms });
    });
    const result = await instance;
    tally.timeouts += result.timeouts;
    tally.socketErrors += result.errors - result.timeouts;
  });
  await Promise.all(runs);
  tally.seconds = (performance.now() - started) / 1000;
  return tally;
}
