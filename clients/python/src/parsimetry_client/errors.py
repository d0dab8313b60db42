"""A refusal from the service as an exception carrying its RFC 9457 problem details."""
from __future__ import annotations

import json
from typing import Any, Dict, List, Mapping, Optional


class ParsimetryError(Exception):
    """The service refused a request: ``status`` and the problem details it sent.

    ``errors`` lists the fields at fault, each with a JSON-pointer-like ``path``
    (``candidates/2/terms/0``) and a ``message``.
    """

    def __init__(self, problem: Mapping[str, Any]) -> None:
        self.problem: Dict[str, Any] = dict(problem)
        self.status: int = int(self.problem.get("status", 0))
        self.type: str = str(self.problem.get("type", "about:blank"))
        self.title: str = str(self.problem.get("title", ""))
        self.detail: str = str(self.problem.get("detail", ""))
        self.errors: List[Dict[str, Any]] = list(self.problem.get("errors") or [])
        where = "; ".join(f'{e.get("path") or "(request)"}: {e.get("message")}' for e in self.errors)
        super().__init__(f"{self.status} {self.title}: {self.detail}" + (f" ({where})" if where else ""))


class UnreadableRecordsError(Exception):
    """A listing page held rows that no longer read back as records: the audit store is damaged."""

    def __init__(self, rows: List[Dict[str, Any]]) -> None:
        self.rows = rows
        seqs = ", ".join(str(r.get("seq")) for r in rows)
        super().__init__(f"the listing holds {len(rows)} row(s) that no longer read back as records "
                         f"(chain positions {seqs}); run GET /v1/audit/verify")


def _is_problem(value: Any) -> bool:
    return isinstance(value, dict) and isinstance(value.get("status"), int) and isinstance(value.get("title"), str)


def problem_from_answer(status: int, reason: Optional[str], body: bytes) -> ParsimetryError:
    """The error for a refused answer: its problem+json, or one made from the status and body."""
    text = body.decode("utf-8", "replace")
    try:
        parsed = json.loads(text)
    except ValueError:
        parsed = None
    if _is_problem(parsed):
        return ParsimetryError(parsed)
    return ParsimetryError({
        "type": "about:blank",
        "title": reason or f"HTTP {status}",
        "status": status,
        "detail": text[:500] or "the service answered without a body",
    })


def problem_from_event(data: Any) -> ParsimetryError:
    """A problem that arrived as an event stream's closing ``problem`` event."""
    if _is_problem(data):
        return ParsimetryError(data)
    return ParsimetryError({"type": "about:blank", "title": "Malformed problem event", "status": 502, "detail": json.dumps(data)[:500]})
