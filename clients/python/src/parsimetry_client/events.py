"""Server-sent events (WHATWG HTML, "Server-sent events") read line by line from a response.

The service sends ``event:`` and one ``data:`` line of JSON per event; the reader still follows
the format's general rules: several data lines join with a newline, a line starting with a colon
is a comment, and CR LF, LF or CR ends a line.
"""
from __future__ import annotations

from typing import IO, Iterator, List, NamedTuple


class ServerEvent(NamedTuple):
    event: str
    data: str


def _lines(stream: IO[bytes]) -> Iterator[str]:
    pending = b""
    for chunk in iter(lambda: stream.readline(65536), b""):
        pending += chunk
        # readline splits on LF only: split the rest on CR LF and lone CR here, keeping a trailing
        # CR back in case its LF is in the next read.
        text = pending.replace(b"\r\n", b"\n")
        keep = text.endswith(b"\r")
        if keep:
            text = text[:-1]
        parts = text.replace(b"\r", b"\n").split(b"\n")
        pending = parts.pop() + (b"\r" if keep else b"")
        for part in parts:
            yield part.decode("utf-8")
    if pending:
        yield pending.rstrip(b"\r").decode("utf-8")


def server_events(stream: IO[bytes]) -> Iterator[ServerEvent]:
    event = ""
    data: List[str] = []
    for line in _lines(stream):
        if line == "":
            if data:
                yield ServerEvent(event or "message", "\n".join(data))
            event, data = "", []
            continue
        if line.startswith(":"):
            continue
        field, _, value = line.partition(":")
        if value.startswith(" "):
            value = value[1:]
        if field == "event":
            event = value
        elif field == "data":
            data.append(value)
