// The part of autocannon 9's programmatic API that Gatewell's load test uses (the package ships no types).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  namespace autocannon {
    /** One request of a connection's sequence. */
    interface Request {
      method?: 'GET' | 'POST';
      path?: string;
      headers?: Record<string, string>;
      body?: string | Buffer;
      /** Called before each send; returns the request to send (a copy with a new body, say). */
      setupRequest?: (request: Request, context: Record<string, unknown>) => Request;
      onResponse?: (
        status: number,
        body: string,
        context: Record<string, unknown>,
        headers: Record<string, string | string[]>,
      ) => void;
    }

    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      /** Requests per second per connection; unset sends the next request as soon as an answer arrives. */
      connectionRate?: number;
      /** Seconds before a request counts as timed out. */
      timeout?: number;
      requests?: Request[];
      ignoreCoordinatedOmission?: boolean;
    }

    interface Client extends EventEmitter {
      /** The connection's request context; Gatewell's template keeps the route of the request in flight there. */
      requestIterator: { context: Record<string, unknown> };
    }

    interface Result {
      errors: number;
      timeouts: number;
      non2xx: number;
      totalCompletedRequests: number;
      duration: number;
    }

    interface Instance extends EventEmitter, PromiseLike<Result> {
      stop(): void;
      on(
        event: 'response',
        listener: (client: Client, statusCode: number, bytes: number, responseTimeMs: number) => void,
      ): this;
      on(event: 'reqError', listener: (error: Error) => void): this;
    }
  }

  function autocannon(options: autocannon.Options): autocannon.Instance;
  export default autocannon;
}
