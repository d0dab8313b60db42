// REQUEST_TIMEOUT_MS bounds how long a client may take to send a whole request
// (headers and body), so slow senders cannot hold sockets. Node's HTTP server
// enforces it and reports through 'clientError'; the answer here is a problem
// document naming the setting. The work a request asks for is bounded apart, by
// price (MAX_REQUEST_WORK and the other caps, src/core/pricing) before any of it
// starts, and by COMPUTE_DEADLINE_MS while it runs.
import type { Socket } from 'node:net';
import { STATUS_CODES } from 'node:http';
import type { FastifyServerOptions } from 'fastify';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { refusalTypes } from './refusal.ts';

function rawProblem(socket: Socket, status: number, body: object): void {
  const text = JSON.stringify(body);
  socket.write(`HTTP/1.1 ${status} ${STATUS_CODES[status]}\r\nContent-Type: ${PROBLEM_CONTENT_TYPE}\r\n` +
    `Content-Length: ${Buffer.byteLength(text)}\r\nConnection: close\r\n\r\n${text}`);
}

export function requestTimeoutOptions(timeoutMs: number): Pick<FastifyServerOptions, 'requestTimeout' | 'clientErrorHandler'> & { http: object } {
  return {
    requestTimeout: timeoutMs,
    http: {
      // Node checks the deadline on this period (30 s by default): keep it a
      // fraction of the limit so the limit means what it says.
      connectionsCheckingInterval: Math.min(30_000, Math.max(25, Math.round(timeoutMs / 4))),
      headersTimeout: Math.min(60_000, timeoutMs),
    },
    clientErrorHandler(error: Error & { code?: string }, socket: Socket) {
      if (error.code === 'ECONNRESET' || socket.destroyed) return;
      if (socket.writable) {
        if (error.code === 'ERR_HTTP_REQUEST_TIMEOUT') {
          rawProblem(socket, 408, problem(408, refusalTypes.requestTimeout, 'Request timeout',
            `the request was not received within ${timeoutMs} ms (REQUEST_TIMEOUT_MS)`,
            { limit: timeoutMs, setting: 'REQUEST_TIMEOUT_MS' }));
        } else if (error.code === 'HPE_HEADER_OVERFLOW') {
          rawProblem(socket, 431, problem(431, problemTypes.invalidRequest, 'Request headers too large',
            'the request headers exceed the server\'s limit (16 KiB, Node\'s --max-http-header-size)'));
        } else {
          rawProblem(socket, 400, problem(400, problemTypes.invalidRequest, 'Malformed HTTP request', 'the request is not valid HTTP/1.1'));
        }
      }
      socket.destroy(error);
    },
  };
}
