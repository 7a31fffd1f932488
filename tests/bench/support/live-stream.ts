/** A person's GET /api/events, read as a browser's EventSource would, keeping what arrives. */
export interface LiveEvent {
  type: string;
  data: Record<string, unknown>;
  /** performance.now() when the chunk holding it was read. */
  at: number;
}

export class LiveStream {
  readonly #events: LiveEvent[] = [];
  readonly #waiters = new Set<() => void>();
  readonly controller = new AbortController();
  #ended: Error | null = null;

  static async open(origin: string, cookie: string): Promise<LiveStream> {
    const stream = new LiveStream();
    const response = await fetch(`${origin}/api/events`, {
      headers: { cookie, accept: 'text/event-stream' },
      signal: stream.controller.signal,
    });
    if (response.status !== 200 || !response.body)
      throw new Error(`GET /api/events answered ${response.status}`);
    void stream.#read(response.body);
    await stream.next((event) => event.type === 'ready', 10_000);
    return stream;
  }

  async #read(body: ReadableStream<Uint8Array>) {
    const reader = body.getReader();
    const decoder = new TextDecoder();
    let buffered = '';
    try {
      for (;;) {
        const { value, done } = await reader.read();
        if (done) break;
        const at = performance.now();
        buffered += decoder.decode(value, { stream: true });
        for (let end = buffered.indexOf('\n\n'); end !== -1; end = buffered.indexOf('\n\n')) {
          const frame = buffered.slice(0, end);
          buffered = buffered.slice(end + 2);
          let type = 'message';
          let data = '';
          for (const line of frame.split('\n')) {
            if (line.startsWith('event: ')) type = line.slice(7);
            else if (line.startsWith('data: ')) data += line.slice(6);
          }
          if (data !== '') this.#events.push({ type, data: JSON.parse(data) as Record<string, unknown>, at });
        }
        for (const wake of this.#waiters) wake();
      }
      this.#ended = new Error('the event stream ended');
    } catch (error) {
      this.#ended = error as Error;
    }
    for (const wake of this.#waiters) wake();
  }

  /** The first matching event, kept or still to come (taken out of the queue). */
  next(match: (event: LiveEvent) => boolean, timeoutMs: number): Promise<LiveEvent> {
    return new Promise((resolve, reject) => {
      const check = () => {
        const index = this.#events.findIndex(match);
        if (index !== -1) {
          done();
          resolve(this.#events.splice(index, 1)[0]!);
        } else if (this.#ended) {
          done();
          reject(this.#ended);
        }
      };
      const timer = setTimeout(() => {
        done();
        reject(new Error(`no matching event within ${timeoutMs} ms`));
      }, timeoutMs);
      const done = () => {
        clearTimeout(timer);
        this.#waiters.delete(check);
      };
      this.#waiters.add(check);
      check();
    });
  }

  close() {
    this.controller.abort();
  }
}
