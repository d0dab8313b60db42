"""Requests made ready for JSON: DataFrames as ``data.columns``, missing values as null.

The service reads ``data.columns`` as equal-length arrays of numbers, text or null (missing).
A pandas DataFrame becomes exactly that: numeric columns stay numbers; categoricals, strings and
booleans become text columns (the service codes text as a factor); NaN, None, NaT and pd.NA
become null. Everywhere in a request a float NaN is sent as null (pandas' and numpy's missing
value), numpy scalars and arrays as plain numbers and lists; infinities are refused here, since
JSON has no word for them.
"""
from __future__ import annotations

import math
import numbers
from typing import Any, Dict, List, Mapping, Optional


def _pandas() -> Any:
    try:
        import pandas  # noqa: PLC0415 - optional: imported only when a caller has it
    except ImportError:
        return None
    return pandas


def is_data_frame(value: Any) -> bool:
    pd = _pandas()
    return pd is not None and isinstance(value, pd.DataFrame)


def _number(value: Any) -> bool:
    return isinstance(value, numbers.Real) and not isinstance(value, bool)


def columns_from_frame(frame: Any) -> Dict[str, List[Any]]:
    """A DataFrame's columns as the service's ``data.columns``."""
    pd = _pandas()
    api = pd.api.types
    columns: Dict[str, List[Any]] = {}
    for name, series in frame.items():
        if not isinstance(name, str):
            raise TypeError(f"column {name!r}: column names must be text")
        missing = series.isna().tolist()
        values = series.astype(object).tolist()
        if api.is_datetime64_any_dtype(series) or api.is_timedelta64_dtype(series):
            raise TypeError(f"column {name!r}: dates and durations are not numbers; send e.g. days since a start as numbers, or text")
        text = isinstance(series.dtype, (pd.CategoricalDtype, pd.StringDtype))
        if not text and api.is_bool_dtype(series):
            columns[name] = [None if m else ("true" if v else "false") for v, m in zip(values, missing)]
        elif not text and (api.is_numeric_dtype(series) or _only_numbers(values, missing)):
            columns[name] = [None if m else _plain_number(v) for v, m in zip(values, missing)]
        else:
            columns[name] = [None if m else str(v) for v, m in zip(values, missing)]
    return columns


def _only_numbers(values: List[Any], missing: List[bool]) -> bool:
    # An object column holding only numbers (Decimal, int, float) is numeric, as the same values
    # in a list would be; one holding any text is text.
    return any(not m for m in missing) and all(m or _number(v) for v, m in zip(values, missing))


def _plain_number(value: Any) -> Any:
    if isinstance(value, numbers.Integral):
        return int(value)
    return float(value)


def prepared(value: Any, path: str = "") -> Any:
    """A copy of a request with DataFrames, numpy values and NaN turned into plain JSON values."""
    if is_data_frame(value):
        if path == "data":
            return {"columns": columns_from_frame(value)}
        return columns_from_frame(value)
    if isinstance(value, Mapping):
        return {str(k): prepared(v, f"{path}/{k}" if path else str(k)) for k, v in value.items()}
    if isinstance(value, (str, bytes)):
        return value.decode("utf-8") if isinstance(value, bytes) else value
    if hasattr(value, "tolist") and not isinstance(value, (int, float)):
        # numpy arrays and scalars, pandas Series and Index
        return prepared(value.tolist(), path)
    if isinstance(value, (list, tuple)):
        return [prepared(v, f"{path}/{i}") for i, v in enumerate(value)]
    if isinstance(value, bool) or value is None:
        return value
    if _number(value):
        number = _plain_number(value)
        if isinstance(number, float) and math.isnan(number):
            return None
        if isinstance(number, float) and math.isinf(number):
            raise ValueError(f"{path or '(request)'}: infinity has no JSON form; send a finite number or null")
        return number
    missing = _missing_scalar(value)
    if missing:
        return None
    return value


def _missing_scalar(value: Any) -> Optional[bool]:
    pd = _pandas()
    if pd is None:
        return None
    try:
        return bool(pd.isna(value))
    except (TypeError, ValueError):
        return None
