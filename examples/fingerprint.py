#!/usr/bin/env python3
"""Compute parsimetry's dataset fingerprint for a comparison or search request,
with the standard library only, so a caller can state `datasetFingerprint` up
front.

    python3 examples/fingerprint.py < request.json

For rows (data.columns), the serialisation (README, "Dataset fingerprint"):
  * used columns: the response, the weights (if any), and every column a
    candidate's terms (or a search's pool and always terms) use, a
    generalised linear candidate's offset, the request's trials (read by
    binomial candidates), the data columns an expression names, and the
    censoring status and upper columns; the others sorted by code point;
  * used rows: those with no null in any used column (the upper column, read
    on interval rows only, takes no part) and no weight of 0, in data order;
  * bytes: "parsimetry-dataset-v1\\n", the row count as uint64 big-endian, then
    per column a role byte (R response, W weights, X other), the UTF-8 name
    with a uint32 big-endian length, a kind byte (n numeric, t text) and the
    values on the used rows: numbers as IEEE 754 binary64 big-endian (-0 as 0),
    text as uint32 length + UTF-8 (a column that is not all numbers on those
    rows is text: its numbers written as JavaScript writes them, null as
    "null");
  * fingerprint: "sha256:" + the hex SHA-256 of those bytes.

For a summary (data.summary), the fingerprint of the summary as sent: the
bytes "parsimetry-summary-v1\n", rows as binary64, the number of columns as
uint32 and each name as uint32 length + UTF-8, the means and then the centred
cross products row by row as binary64 (-0 as 0), and "W" with the weight sum
and the sum of log weights as binary64, or "U" when unweighted.
"""
import hashlib
import json
import re
import struct
import sys

# The expression grammar's tokens (README, nonlinear mean functions): numbers
# are read before names, and these names are functions or the constant pi.
NUMBER = re.compile(r"(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?")
NAME = re.compile(r"[A-Za-z_][A-Za-z0-9_]*")
RESERVED = {"exp", "log", "log10", "sqrt", "abs", "sin", "cos", "tan", "atan", "pi"}


def term_columns(term):
    if isinstance(term, str):
        return [term]
    of = term["of"]
    return list(of) if isinstance(of, list) else [of]


def expression_columns(candidate, columns):
    """The data columns a nonlinear candidate's expression names: every name
    that is not a function, not pi and not a parameter (a key of start, or of
    the first of starts)."""
    text = candidate["expression"]
    start = candidate.get("start") or (candidate.get("starts") or [{}])[0]
    names, i = [], 0
    while i < len(text):
        number = NUMBER.match(text, i)
        name = None if number else NAME.match(text, i)
        if number:
            i = number.end()
        elif name:
            names.append(name.group())
            i = name.end()
        else:
            i += 1
    return [n for n in names if n not in RESERVED and n not in start and n in columns]


def is_least_squares(candidate):
    """A candidate with terms is least squares unless a family other than
    gaussian, a link other than identity or an offset makes it a GLM."""
    return (candidate.get("family", "gaussian") == "gaussian"
            and candidate.get("link", "identity") == "identity"
            and "offset" not in candidate)


def candidate_columns(candidate, columns, trials):
    """The columns one candidate reads besides the response and weights."""
    if "expression" in candidate:
        return expression_columns(candidate, columns)
    used = [c for t in candidate.get("terms", []) for c in term_columns(t)]
    glm = ("terms" in candidate and "distribution" not in candidate and not is_least_squares(candidate)) or "fitted" in candidate
    if glm and "offset" in candidate and "fitted" not in candidate:
        used.append(candidate["offset"])
    if glm and trials and candidate.get("family") == "binomial":
        used.append(trials)
    return used


def js_number_text(v):
    """A number as JavaScript's String(v) writes it (ECMAScript Number::toString):
    the shortest digits that read back, positional from 1e-6 up to 1e21."""
    if isinstance(v, bool):
        return "true" if v else "false"
    v = float(v)
    if v == 0:
        return "0"
    if v != v:
        return "NaN"
    sign = "-" if v < 0 else ""
    mantissa, _, exponent = repr(abs(v)).partition("e")
    whole, _, fraction = mantissa.partition(".")
    digits = (whole + fraction.rstrip("0")).lstrip("0") if fraction.strip("0") else whole.lstrip("0")
    # n: the position of the decimal point relative to the digits (value = 0.digits × 10^n).
    n = len(whole.lstrip("0")) if whole.strip("0") else -(len(fraction) - len(fraction.lstrip("0")))
    n += int(exponent or 0)
    digits = digits.rstrip("0") or "0"
    k = len(digits)
    if k <= n <= 21:
        return sign + digits + "0" * (n - k)
    if 0 < n <= 21:
        return sign + digits[:n] + "." + digits[n:]
    if -6 < n <= 0:
        return sign + "0." + "0" * (-n) + digits
    e = n - 1
    return sign + digits[0] + ("." + digits[1:] if k > 1 else "") + "e" + ("+" if e > 0 else "-") + str(abs(e))


def text_of(v):
    """A value of a text column as the service writes it (JavaScript's String)."""
    if v is None:
        return "null"
    if isinstance(v, (int, float)):
        return js_number_text(v)
    return str(v)


def binary64(values):
    return b"".join(struct.pack(">d", float(v) + 0.0) for v in values)  # + 0.0 turns -0.0 into 0.0


def summary_fingerprint(summary):
    h = hashlib.sha256()
    h.update(b"parsimetry-summary-v1\n")
    h.update(binary64([summary["rows"]]))
    h.update(struct.pack(">I", len(summary["columns"])))
    for name in summary["columns"]:
        encoded = name.encode("utf-8")
        h.update(struct.pack(">I", len(encoded)) + encoded)
    h.update(binary64(summary["means"]))
    for row in summary["centredCrossProducts"]:
        h.update(binary64(row))
    weights = summary.get("weights")
    h.update(b"W" + binary64([weights["sum"], weights["sumLog"]]) if weights else b"U")
    return "sha256:" + h.hexdigest()


def fingerprint(request):
    if "summary" in request["data"]:
        return summary_fingerprint(request["data"]["summary"])
    columns = request["data"]["columns"]
    response = request["response"]
    weights = request.get("weights")
    trials = request.get("trials")
    censoring = request.get("censoring") or {}
    used = []
    for candidate in request.get("candidates", []):
        used.extend(candidate_columns(candidate, columns, trials))
    for term in request.get("pool", []) + request.get("always", []):
        used.extend(term_columns(term))
    if "status" in censoring:
        used.append(censoring["status"])
    # The upper column is read on interval rows only: a null elsewhere drops no row.
    upper = censoring.get("upper")
    deciding = set(used) - {response, weights}
    others = sorted(deciding | ({upper} if upper else set()) - {response, weights})
    ordered = [("R", response)] + ([("W", weights)] if weights else []) + [("X", name) for name in others]
    total = len(next(iter(columns.values())))
    rows = [i for i in range(total)
            if all(columns[name][i] is not None for name in [response] + ([weights] if weights else []) + sorted(deciding))
            and not (weights and columns[weights][i] == 0)]  # a zero weight leaves the row out

    h = hashlib.sha256()
    h.update(b"parsimetry-dataset-v1\n")
    h.update(struct.pack(">Q", len(rows)))
    for role, name in ordered:
        values = [columns[name][i] for i in rows]
        numeric = all(isinstance(v, (int, float)) and not isinstance(v, bool) for v in values)
        encoded = name.encode("utf-8")
        h.update(role.encode("ascii") + struct.pack(">I", len(encoded)) + encoded + (b"n" if numeric else b"t"))
        for v in values:
            if numeric:
                h.update(binary64([v]))
            else:
                text = text_of(v).encode("utf-8")
                h.update(struct.pack(">I", len(text)) + text)
    return "sha256:" + h.hexdigest()


if __name__ == "__main__":
    print(fingerprint(json.load(sys.stdin)))
