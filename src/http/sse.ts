// Server-sent events (WHATWG HTML, "Server-sent events"): `event: name`,
// one `data:` line of JSON, a blank line. The reply is taken over from
// fastify (hijacked), so the headers fastify's hooks set so far are copied
// onto the raw response here.
import type { FastifyReply } from 'fastify';

export const EVENT_STREAM_TYPE = 'text/event-stream';

export function wantsEventStream(accept: string | undefined): boolean {
  return typeof accept === 'string' && accept.toLowerCase().includes(EVENT_STREAM_TYPE);
}

export class EventStream {
  private open = true;

  constructor(private readonly reply: FastifyReply, onDisconnect: () => void) {
    const headers = { ...reply.getHeaders() } as Record<string, string | number | string[]>;
    reply.hijack();
    const raw = reply.raw;
    raw.writeHead(200, {
      ...headers,
      'content-type': `${EVENT_STREAM_TYPE}; charset=utf-8`,
      'cache-control': 'no-store',
      'x-request-id': reply.request.id,
      // Proxies that buffer (nginx) would hold progress back until the end.
      'x-accel-buffering': 'no',
    });
    raw.on('close', () => {
      // A close before we ended the stream is the client going away.
      if (this.open) {
        this.open = false;
        onDisconnect();
      }
    });
  }

  get isOpen(): boolean {
    return this.open;
  }

  send(event: string, data: unknown): void {
    if (!this.open) return;
    this.reply.raw.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
  }

  /** Sends the last event and ends the response. */
  end(event: string, data: unknown): void {
    if (!this.open) return;
    this.send(event, data);
    this.open = false;
    this.reply.raw.end();
  }
}
