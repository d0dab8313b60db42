"""The parsimetry client: one method per endpoint, standard library only (urllib)."""
from __future__ import annotations

import json
import urllib.error
import urllib.parse
import urllib.request
from typing import IO, Any, Callable, Dict, Iterable, Iterator, List, Mapping, Optional, Sequence, Tuple, Union

from .columns import prepared
from .errors import ParsimetryError, UnreadableRecordsError, problem_from_answer, problem_from_event
from .events import server_events

JSON = Dict[str, Any]
Body = Union[str, bytes, IO[bytes], Iterable[bytes]]


class Client:
    """A client of one parsimetry service.

    ``base_url`` is where it answers (``http://127.0.0.1:8080``; a path prefix is kept);
    ``api_key`` is sent as ``Authorization: Bearer <key>`` (omit it for a service with no keys).
    """

    def __init__(self, base_url: str, api_key: Optional[str] = None, timeout: float = 120.0) -> None:
        parts = urllib.parse.urlsplit(base_url if isinstance(base_url, str) else "")
        if parts.scheme.lower() not in ("http", "https") or not parts.netloc:
            raise ValueError(f"base_url: an absolute http(s) URL such as http://127.0.0.1:8080, not {base_url!r}")
        self.base_url = base_url.rstrip("/")
        self.api_key = api_key
        self.timeout = timeout

    # -- the endpoints ------------------------------------------------------------------------

    def compare(self, request: Mapping[str, Any]) -> JSON:
        """POST /v1/comparisons: fit and score the candidates, rank them, record the comparison.

        ``request["data"]`` may be a pandas DataFrame (see ``parsimetry_client.columns``).
        """
        return self._json("POST", "/v1/comparisons", body=request)

    def search(self, request: Mapping[str, Any]) -> JSON:
        """POST /v1/searches: every subset of a pool of terms; the best ``top`` refitted and recorded."""
        return self._json("POST", "/v1/searches", body=request)

    def search_stream(self, request: Mapping[str, Any]) -> Iterator[Tuple[str, JSON]]:
        """The same search as server-sent events: ``("progress", {...})`` pairs, then ``("result", {...})``.

        A refusal, before the stream or as its closing event, raises ParsimetryError. Closing the
        generator early closes the connection, and the service stops the search and records nothing.
        """
        with self._send("POST", "/v1/searches", body=_json_body(request), content_type="application/json", accept="text/event-stream") as answer:
            kind = answer.headers.get("content-type", "")
            if not kind.startswith("text/event-stream"):
                raise ParsimetryError({"type": "about:blank", "title": "Not an event stream", "status": 502, "detail": f"expected text/event-stream, got {kind or 'no content type'}"})
            for event, data in server_events(answer):
                parsed = json.loads(data)
                if event == "problem":
                    raise problem_from_event(parsed)
                if event == "progress":
                    yield event, parsed
                elif event == "result":
                    yield event, parsed
                    return
        raise ParsimetryError({"type": "about:blank", "title": "Stream ended early", "status": 502, "detail": "the event stream closed before its result"})

    def comparison(self, id: str) -> JSON:
        """GET /v1/comparisons/{id}: the stored record with its integrity check."""
        return self._json("GET", _record(id))

    def list(self, *, fingerprint: Optional[str] = None, caller: Optional[str] = None, label: Optional[str] = None,
             from_: Optional[str] = None, to: Optional[str] = None, page_size: Optional[int] = None,
             on_unreadable: Optional[Callable[[List[JSON]], None]] = None) -> Iterator[JSON]:
        """GET /v1/comparisons: every matching record, newest first, following the cursor page by page.

        Rows that no longer read back as records (damaged in the database) go to ``on_unreadable``;
        without it they raise UnreadableRecordsError, so a damaged audit trail is never skipped in silence.
        """
        cursor: Optional[str] = None
        while True:
            page = self.list_page(fingerprint=fingerprint, caller=caller, label=label, from_=from_, to=to, page_size=page_size, cursor=cursor)
            yield from page["records"]
            if page["unreadable"]:
                if on_unreadable is None:
                    raise UnreadableRecordsError(page["unreadable"])
                on_unreadable(page["unreadable"])
            cursor = page.get("nextCursor")
            if cursor is None:
                return

    def list_page(self, *, fingerprint: Optional[str] = None, caller: Optional[str] = None, label: Optional[str] = None,
                  from_: Optional[str] = None, to: Optional[str] = None, page_size: Optional[int] = None,
                  cursor: Optional[str] = None) -> JSON:
        """One page of GET /v1/comparisons (``records``, ``unreadable``, ``nextCursor``)."""
        query = {"fingerprint": fingerprint, "caller": caller, "label": label, "from": from_, "to": to, "limit": page_size, "cursor": cursor}
        return self._json("GET", "/v1/comparisons", query=query)

    def verify(self) -> JSON:
        """GET /v1/audit/verify: re-hash the whole audit chain."""
        return self._json("GET", "/v1/audit/verify")

    def replay(self, id: str) -> JSON:
        """POST /v1/comparisons/{id}/replay: re-run a stored comparison with today's code, list what changed."""
        return self._json("POST", _record(id) + "/replay")

    def chart_svg(self, id: str, *, criterion: Optional[str] = None, size: Optional[str] = None,
                  width: Optional[int] = None, height: Optional[int] = None) -> str:
        """GET /v1/comparisons/{id}/chart.svg as SVG text."""
        query = {"criterion": criterion, "size": size, "width": width, "height": height}
        return self._text(_record(id) + "/chart.svg", "image/svg+xml", query)

    def report_html(self, id: str, *, criterion: Optional[str] = None, size: Optional[str] = None,
                    width: Optional[int] = None, height: Optional[int] = None) -> str:
        """GET /v1/comparisons/{id}/report as HTML text."""
        query = {"criterion": criterion, "size": size, "width": width, "height": height}
        return self._text(_record(id) + "/report", "text/html", query)

    def summarise(self, body: Body, columns: Sequence[str], *, format: str = "csv", weights: Optional[str] = None) -> JSON:
        """POST /v1/summaries: fold CSV (with a header row) or NDJSON rows into a summary.

        ``body`` is text, bytes, a binary file or an iterable of byte chunks (sent as it is read).
        The answer's ``data`` goes as it is into a comparison's or a search's ``data``.
        """
        if format not in ("csv", "ndjson"):
            raise ValueError("format: 'csv' or 'ndjson'")
        content_type = "text/csv" if format == "csv" else "application/x-ndjson"
        data = body.encode("utf-8") if isinstance(body, str) else body
        query = {"columns": ",".join(columns), "weights": weights}
        with self._send("POST", "/v1/summaries", query=query, body=data, content_type=content_type, accept="application/json") as answer:
            return json.load(answer)

    # -- the wire -----------------------------------------------------------------------------

    def _json(self, method: str, path: str, *, body: Optional[Mapping[str, Any]] = None, query: Optional[Mapping[str, Any]] = None) -> JSON:
        payload = None if body is None else _json_body(body)
        with self._send(method, path, query=query, body=payload, content_type="application/json" if payload is not None else None, accept="application/json") as answer:
            return json.load(answer)

    def _text(self, path: str, accept: str, query: Mapping[str, Any]) -> str:
        with self._send("GET", path, query=query, accept=accept) as answer:
            return answer.read().decode("utf-8")

    def _send(self, method: str, path: str, *, query: Optional[Mapping[str, Any]] = None, body: Any = None,
              content_type: Optional[str] = None, accept: str) -> Any:
        url = self.base_url + path
        present = {k: str(v) for k, v in (query or {}).items() if v is not None}
        if present:
            url += "?" + urllib.parse.urlencode(present)
        headers = {"accept": accept}
        if content_type:
            headers["content-type"] = content_type
        if self.api_key is not None:
            headers["authorization"] = f"Bearer {self.api_key}"
        request = urllib.request.Request(url, data=body, headers=headers, method=method)
        try:
            return urllib.request.urlopen(request, timeout=self.timeout)
        except urllib.error.HTTPError as refused:
            with refused:
                raise problem_from_answer(refused.code, refused.reason, refused.read()) from None


def _record(id: str) -> str:
    return "/v1/comparisons/" + urllib.parse.quote(id, safe="")


def _json_body(request: Mapping[str, Any]) -> bytes:
    return json.dumps(prepared(request), allow_nan=False, ensure_ascii=False).encode("utf-8")
