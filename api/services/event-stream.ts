import type { Request, Response } from 'express';
import { depsOf } from '../deps';
import type { Actor } from './actors';

const heartbeatMs = 25_000;

/**
 * Server-Sent Events for one signed-in person: every alert or notification event (from any API
 * process, through LISTEN/NOTIFY) addressed to them, as a small "refetch this" message.
 */
export function streamEvents(req: Request, res: Response, actor: Actor) {
  const { events } = depsOf(req);
  res.writeHead(200, {
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-store',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.write('retry: 5000\n\n');
  res.write(`event: ready\ndata: {}\n\n`);
  if (!events) return;
  const stop = events.on((event) => {
    if (!event.userIds.includes(actor.id)) return;
    res.write(
      `event: ${event.type}\ndata: ${JSON.stringify({ tankId: event.tankId, alertId: event.alertId })}\n\n`,
    );
  });
  const heartbeat = setInterval(() => res.write(': keep-alive\n\n'), heartbeatMs);
  req.on('close', () => {
    clearInterval(heartbeat);
    stop();
  });
}
