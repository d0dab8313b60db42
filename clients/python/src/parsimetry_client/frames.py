"""Results as pandas DataFrames: rankings, models and coefficients (pandas needed for these only).

Each function takes a comparison result, a stored comparison (its ``result`` is used) or a
search result.
"""
from __future__ import annotations

from typing import Any, Dict, List, Mapping, Optional


def _pd() -> Any:
    try:
        import pandas  # noqa: PLC0415 - optional
    except ImportError as missing:
        raise ImportError("parsimetry_client.frames needs pandas: pip install pandas") from missing
    return pandas


def _result(answer: Mapping[str, Any]) -> Mapping[str, Any]:
    return answer["result"] if "models" not in answer and "result" in answer else answer


def rankings_frame(answer: Mapping[str, Any], criterion: Optional[str] = None) -> Any:
    """One row per model in rank order for ``criterion`` (default: the one the request ranked by)."""
    result = _result(answer)
    key = criterion or result["conventions"]["rankBy"]
    rankings = result["rankings"]
    if key not in rankings:
        raise KeyError(f"no ranking by {key!r}; this result has {', '.join(rankings)}")
    return _pd().DataFrame.from_records(list(rankings[key]))


def models_frame(answer: Mapping[str, Any]) -> Any:
    """One row per model with its single-valued fields (criteria, fit, counts), indexed by name."""
    rows: List[Dict[str, Any]] = [
        {k: v for k, v in model.items() if not isinstance(v, (list, dict)) or k == "terms"}
        for model in _result(answer)["models"]
    ]
    return _pd().DataFrame.from_records(rows).set_index("name")


def coefficients_frame(answer: Mapping[str, Any]) -> Any:
    """One row per coefficient of every model: model, term, estimate, standardError and the rest."""
    rows = [
        {"model": model["name"], **coefficient}
        for model in _result(answer)["models"]
        for coefficient in model.get("coefficients") or []
    ]
    return _pd().DataFrame.from_records(rows, columns=None if rows else ["model", "term", "estimate", "standardError"])
