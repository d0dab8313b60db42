// REQUEST_TIMEOUT_MS over a real socket: a client that stops sending mid-body
// gets 408 problem+json naming the setting, and the socket is closed.
import { connect } from 'node:net';
import t from 'tap';
import { buildTestApp } from '../../helper.ts';

t.test('a stalled body is answered 408 naming REQUEST_TIMEOUT_MS', async (t) => {
  const { app } = await buildTestApp(t, { requestTimeoutMs: 300 });
  await app.listen({ host: '127.0.0.1', port: 0 });
  const { port } = app.server.address() as { port: number };
  const started = Date.now();
  const answer = await new Promise<string>((resolve, reject) => {
    const socket = connect(port, '127.0.0.1', () => {
      socket.write('POST /v1/comparisons HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: 1000\r\n\r\n{"data":');
    });
    let text = '';
    socket.on('data', (d) => { text += d; });
    socket.on('close', () => resolve(text));
    socket.on('error', reject);
  });
  const elapsed = Date.now() - started;
  t.match(answer, /^HTTP\/1\.1 408 /);
  t.match(answer, /application\/problem\+json/);
  const body = JSON.parse(answer.slice(answer.indexOf('\r\n\r\n') + 4));
  t.equal(body.setting, 'REQUEST_TIMEOUT_MS');
  t.equal(body.limit, 300);
  t.ok(elapsed >= 300 && elapsed < 3000, `refused after the limit, not long after (${elapsed} ms)`);
});
