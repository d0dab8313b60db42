// Server-sent events (WHATWG HTML, "Server-sent events") read from a fetch body with web
// streams only, so it runs in browsers and Node alike. The service sends `event:` and one
// `data:` line of JSON per event; the parser still follows the format's general rules
// (several data lines join with a newline, comments start with a colon, CR LF or LF ends a line).

export interface ServerEvent {
  event: string;
  data: string;
}

export async function* serverEvents(body: ReadableStream<Uint8Array>): AsyncGenerator<ServerEvent> {
  const reader = body.getReader();
  const decoder = new TextDecoder();
  let buffer = '';
  let event = '';
  let data: string[] = [];
  try {
    for (;;) {
      const { value, done } = await reader.read();
      if (done) return;
      buffer += decoder.decode(value, { stream: true });
      let newline: number;
      while ((newline = buffer.search(/\r\n|\n|\r/)) >= 0) {
        // A lone CR at the end of the buffer may be the first half of CR LF: wait for more.
        if (buffer[newline] === '\r' && newline === buffer.length - 1) break;
        const line = buffer.slice(0, newline);
        buffer = buffer.slice(newline + (buffer.startsWith('\r\n', newline) ? 2 : 1));
        if (line === '') {
          if (data.length > 0) yield { event: event || 'message', data: data.join('\n') };
          event = '';
          data = [];
          continue;
        }
        if (line.startsWith(':')) continue;
        const colon = line.indexOf(':');
        const field = colon < 0 ? line : line.slice(0, colon);
        let value = colon < 0 ? '' : line.slice(colon + 1);
        if (value.startsWith(' ')) value = value.slice(1);
        if (field === 'event') event = value;
        else if (field === 'data') data.push(value);
      }
    }
  } finally {
    // Leaving early (a caller's break, an error) cancels the body, which closes the connection:
    // the service takes that as the client gone and stops the search.
    await reader.cancel().catch(() => undefined);
  }
}
