// Once close() begins (SIGTERM), requests still arriving on open connections are
// refused with a problem naming the reason, while those already in flight finish
// and commit their audit records.
import type { FastifyInstance } from 'fastify';
import { refusal, refusalTypes } from './refusal.ts';

export function refuseWhileClosing(app: FastifyInstance): void {
  let closing = false;
  app.addHook('preClose', async () => {
    closing = true;
  });
  // Replies to requests already in flight close their connection, so that no
  // keep-alive socket holds the server open once its last reply is sent.
  app.addHook('onSend', async (_request, reply, payload) => {
    if (closing) reply.header('connection', 'close');
    return payload;
  });
  app.addHook('onRequest', async () => {
    if (!closing) return;
    throw refusal(503, refusalTypes.shuttingDown, 'Shutting down',
      'this replica is shutting down and takes no new requests; retry (another replica may answer)', {},
      { 'retry-after': '1', connection: 'close' });
  });
}
