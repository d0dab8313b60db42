// A client that closes its connection before the answer no longer wants it:
// the work stops and nothing is recorded. Node emits 'close' on the response
// when its connection ends, whether after the reply or before; only a close
// before the reply was written is the client going away. Works the same for a
// JSON reply and for a hijacked event stream.
import type { FastifyReply } from 'fastify';

export interface ClientWatch {
  /** True once the client has gone. */
  readonly gone: boolean;
  /** Calls back at once if the client has already gone. */
  onGone(callback: () => void): void;
  stop(): void;
}

export function watchClient(reply: FastifyReply): ClientWatch {
  const raw = reply.raw;
  const callbacks: (() => void)[] = [];
  let gone = raw.destroyed && !raw.writableEnded;
  const onClose = () => {
    if (raw.writableEnded || gone) return;
    gone = true;
    for (const callback of callbacks.splice(0)) callback();
  };
  raw.on('close', onClose);
  return {
    get gone() {
      return gone;
    },
    onGone(callback) {
      if (gone) callback();
      else callbacks.push(callback);
    },
    stop() {
      raw.off('close', onClose);
      callbacks.length = 0;
    },
  };
}
