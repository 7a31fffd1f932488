import { rmSync } from 'node:fs';
import path from 'node:path';
import { bench, describe } from 'vitest';
import { messagesPerMinute } from '@shared/schemas/conversations';
import type { LiveEventData } from '../../api/services/event-stream';
import { createDatabaseFrom } from '../helpers/db';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { startTestCluster } from '../helpers/global-db';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

/*
 * The live path of a tank's conversation: from an owner's POST /api/tanks/:tankId/conversation/messages
 * until a staff member's open event stream (GET /api/events) reads the `conversation` event for it,
 * and from a staff reply until the owner's stream reads it. One API process listening on loopback with
 * its LISTEN connection, job queue and workers, on a throwaway PostgreSQL (fsync off), signed in through
 * the identity provider stand-in. The target is "within a second": this measures and does not
 * judge, but an event that never arrives is a failure, not a slow sample. Run with `npm run bench`.
 */
const messagesPerDirection = 100;
/** Sent each way before measuring: the first line makes the conversation itself. */
const warmUpMessages = 3;
/** Not a speed target: an event this late is taken as lost. */
const eventTimeoutMs = 10_000;
/** Each sender spends at most half the per-person budget, so the rate limit never answers instead. */
const sendersPerSide = Math.ceil((messagesPerDirection + warmUpMessages) / (messagesPerMinute / 2));

interface LiveEvent {
  type: string;
  data: LiveEventData;
  /** performance.now() when the chunk holding it was read. */
  at: number;
}

/** One person's GET /api/events, read as a browser's EventSource would, keeping what arrives. */
class LiveStream {
  readonly #queue: LiveEvent[] = [];
  #waiter: { match: (event: LiveEvent) => boolean; take: (event: LiveEvent) => void } | null = null;
  #failure: Error | null = null;
  #fail: (error: Error) => void = () => {};

  constructor(
    readonly who: string,
    readonly controller: AbortController,
  ) {}

  async read(body: ReadableStream<Uint8Array>) {
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
          const event = parseFrame(frame, at);
          if (event) this.#arrive(event);
        }
      }
      this.#stop(new Error(`${this.who}'s event stream ended`));
    } catch (error) {
      if (!this.controller.signal.aborted) this.#stop(error as Error);
    }
  }

  #arrive(event: LiveEvent) {
    if (this.#waiter?.match(event)) this.#waiter.take(event);
    else this.#queue.push(event);
  }

  #stop(error: Error) {
    this.#failure = error;
    this.#fail(error);
  }

  /** The first matching event, queued or still to come; throws once `eventTimeoutMs` has passed. */
  next(match: (event: LiveEvent) => boolean, what: string): Promise<LiveEvent> {
    const queued = this.#queue.findIndex(match);
    if (queued !== -1) return Promise.resolve(this.#queue.splice(queued, 1)[0]!);
    if (this.#failure) return Promise.reject(this.#failure);
    return new Promise<LiveEvent>((resolve, reject) => {
      const done = () => {
        clearTimeout(timer);
        this.#waiter = null;
        this.#fail = () => {};
      };
      const timer = setTimeout(() => {
        done();
        reject(new Error(`${what} never reached ${this.who}'s event stream (waited ${eventTimeoutMs} ms)`));
      }, eventTimeoutMs);
      this.#waiter = { match, take: (event) => (done(), resolve(event)) };
      this.#fail = (error) => (done(), reject(error));
    });
  }

  count(match: (event: LiveEvent) => boolean) {
    return this.#queue.filter(match).length;
  }

  clear() {
    this.#queue.length = 0;
  }
}

function parseFrame(frame: string, at: number): LiveEvent | null {
  let type = 'message';
  let data = '';
  for (const line of frame.split('\n')) {
    if (line.startsWith('event: ')) type = line.slice('event: '.length);
    else if (line.startsWith('data: ')) data += line.slice('data: '.length);
  }
  return data === '' ? null : { type, data: JSON.parse(data) as LiveEventData, at };
}

interface Participant {
  person: TestPerson;
  browser: HttpBrowser;
}

async function openLiveStream(stack: TestStack, { person, browser }: Participant): Promise<LiveStream> {
  const controller = new AbortController();
  const response = await fetch(`${stack.origin}/api/events`, {
    headers: { cookie: browser.cookieHeader(stack.origin), accept: 'text/event-stream' },
    signal: controller.signal,
  });
  if (response.status !== 200 || !response.body) {
    throw new Error(`GET /api/events for ${person.name} answered ${response.status}`);
  }
  const stream = new LiveStream(person.name, controller);
  void stream.read(response.body);
  await stream.next((event) => event.type === 'ready', 'the ready event');
  return stream;
}

async function arrange(baseUrl: string) {
  const stack = await startTestStack({ background: true, database: await createDatabaseFrom(baseUrl) });
  const { db } = stack.database;
  const company = await createCompany(db);
  const people = (role: 'owner' | 'technician') =>
    Promise.all(
      Array.from({ length: sendersPerSide }, async (_, n) => {
        const person = await createPerson(db, {
          companyId: company.id,
          role,
          issuer: stack.idp.issuer,
          name: `${role === 'owner' ? 'Owner' : 'Technician'} ${n + 1}`,
        });
        const browser = new HttpBrowser();
        await signIn(stack, browser, person);
        return { person, browser };
      }),
    );
  const owners = await people('owner');
  const staff = await people('technician');
  const tank = await createTank(db, {
    companyId: company.id,
    name: 'Reception reef',
    owners: owners.map((owner) => owner.person),
    assignedTechnicianId: staff[0]!.person.id,
  });
  // Each stream's reader also hears the messages of its own side: before a direction is measured its
  // reader's queue is cleared of those.
  const staffStream = await openLiveStream(stack, staff[0]!);
  const ownerStream = await openLiveStream(stack, owners[0]!);
  return { stack, tankId: tank.id, owners, staff, staffStream, ownerStream };
}

// Vitest's bench mode runs no beforeAll/afterAll hooks, so the stack is set up at module load
// (top-level await) and torn down by the last bench's own teardown after the measured run.
const cluster = await startTestCluster();
const world = await arrange(cluster.baseUrl).catch(async (error: unknown) => {
  await cluster.stop();
  throw error;
});

const forThisTank = (event: LiveEvent) => event.type === 'conversation' && event.data.tankId === world.tankId;

/**
 * Tinybench times the whole bench function, which also waits for the sender's answer (it often comes
 * after the event: the news to the other side is written first). That wait is taken off its clock, so
 * the samples it reports are the event's latency alone.
 */
let offClockMs = 0;
const benchClock = () => performance.now() - offClockMs;

interface Direction {
  name: string;
  senders: Participant[];
  watcher: LiveStream;
  sent: number;
  latencies: number[];
}

const ownerToStaff: Direction = {
  name: 'owner → staff',
  senders: world.owners,
  watcher: world.staffStream,
  sent: 0,
  latencies: [],
};
const staffToOwner: Direction = {
  name: 'staff → owner',
  senders: world.staff,
  watcher: world.ownerStream,
  sent: 0,
  latencies: [],
};

async function send({ person, browser }: Participant, body: string) {
  const response = await browser.visit(
    `${world.stack.origin}/api/tanks/${world.tankId}/conversation/messages`,
    {
      method: 'POST',
      headers: { ...world.stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify({ body }),
    },
  );
  if (response.status !== 201) {
    throw new Error(`${person.name}'s message answered ${response.status}: ${await response.text()}`);
  }
}

/** One message from the next sender of the rota until the other side's stream reads its event. */
async function deliverOne(direction: Direction): Promise<number> {
  const sender = direction.senders[direction.sent % direction.senders.length]!;
  direction.sent += 1;
  // Every message makes exactly one event per reader, and each is awaited before the next message,
  // so anything already queued is an extra event: the next one would be taken for the wrong message.
  const extra = direction.watcher.count(forThisTank);
  if (extra > 0) throw new Error(`${extra} conversation events reached ${direction.watcher.who} unasked`);
  const started = performance.now();
  const answered = send(sender, `Message ${direction.sent} (${direction.name})`);
  const event = await Promise.race([
    direction.watcher.next(forThisTank, `The event for message ${direction.sent} (${direction.name})`),
    answered.then(() => new Promise<never>(() => {})),
  ]);
  const latency = event.at - started;
  const waitFrom = performance.now();
  await answered;
  offClockMs += performance.now() - waitFrom;
  return latency;
}

try {
  for (const direction of [ownerToStaff, staffToOwner]) {
    direction.watcher.clear();
    for (let n = 0; n < warmUpMessages; n++) await deliverOne(direction);
  }
} catch (error) {
  stopStack();
  throw error;
}

function percentile(sorted: number[], p: number) {
  return sorted[Math.max(0, Math.ceil(p * sorted.length) - 1)]!;
}

function summary({ name, latencies }: Direction) {
  if (latencies.length === 0) return `${name}: no messages measured`;
  const sorted = [...latencies].sort((a, b) => a - b);
  const ms = (value: number) => `${value.toFixed(1)} ms`;
  return (
    `${name} p50 ${ms(percentile(sorted, 0.5))}, p95 ${ms(percentile(sorted, 0.95))}, ` +
    `max ${ms(sorted.at(-1)!)} over ${sorted.length} messages`
  );
}

function stopStack() {
  world.staffStream.controller.abort();
  world.ownerStream.controller.abort();
  // Tinybench does not await teardown, so the cluster is stopped synchronously (pg_ctl stop) before
  // the bench process can exit; the stack's own close starts first and may not finish.
  void world.stack.close().catch(() => {});
  void cluster.stop();
  // The close above would remove the stand-ins' folder last; the push CA file the stack wrote lies in it.
  const caFile = world.stack.deps.env.PUSH_TRUSTED_CA_FILE;
  if (caFile) rmSync(path.dirname(caFile), { recursive: true, force: true });
}

function tearDown() {
  console.log(
    `live-messages: ${summary(ownerToStaff)}; ${summary(staffToOwner)} ` +
      '(from the POST to the SSE event, one API process on loopback)',
  );
  stopStack();
}

describe('live conversation events', () => {
  for (const direction of [ownerToStaff, staffToOwner]) {
    bench(
      `${direction.name}: a message until the other side's event stream reads it`,
      async () => {
        direction.latencies.push(await deliverOne(direction));
      },
      {
        iterations: messagesPerDirection,
        time: 0,
        warmupIterations: 0,
        warmupTime: 0,
        now: benchClock,
        setup: (_task, mode) => {
          if (mode === 'run') direction.watcher.clear();
        },
        teardown: (_task, mode) => {
          if (mode === 'run' && direction === staffToOwner) tearDown();
        },
      },
    );
  }
});
