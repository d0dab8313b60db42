#!/usr/bin/env python3
"""Compute parsimetry's dataset fingerprint for a comparison or search request,
with the standard library only, so a caller can state `datasetFingerprint` up
front.

    python3 examples/fingerprint.py < request.json

For rows (data.columns), the serialisation (README, "Dataset fingerprint"):
  * used columns: the response, the weights (if any), and every column a
    candidate's terms (or a search's pool and always terms) use; the others
    sorted by code point;
  * used rows: those with no null in any used column and no weight of 0, in
    data order;
  * bytes: "parsimetry-dataset-v1\\n", the row count as uint64 big-endian, then
    per column a role byte (R response, W weights, X other), the UTF-8 name
    with a uint32 big-endian length, a kind byte (n numeric, t text) and the
    values on the used rows: numbers as IEEE 754 binary64 big-endian (-0 as 0),
    text as uint32 length + UTF-8;
  * fingerprint: "sha256:" + the hex SHA-256 of those bytes.

For a summary (data.summary), the fingerprint of the summary as sent: the
bytes "parsimetry-summary-v1\n", rows as binary64, the number of columns as
uint32 and each name as uint32 length + UTF-8, the means and then the centred
cross products row by row as binary64 (-0 as 0), and "W" with the weight sum
and the sum of log weights as binary64, or "U" when unweighted.
"""
import hashlib
import json
import struct
import sys


def term_columns(term):
    if isinstance(term, str):
        return [term]
    of = term["of"]
    return list(of) if isinstance(of, list) else [of]


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
    used = []
    terms = [t for c in request.get("candidates", []) for t in c.get("terms", [])]
    terms += request.get("pool", []) + request.get("always", [])
    for term in terms:
        used.extend(term_columns(term))
    others = sorted(set(used) - {response, weights})
    ordered = [("R", response)] + ([("W", weights)] if weights else []) + [("X", name) for name in others]
    total = len(next(iter(columns.values())))
    rows = [i for i in range(total)
            if all(columns[name][i] is not None for _, name in ordered)
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
                text = str(v).encode("utf-8")
                h.update(struct.pack(">I", len(text)) + text)
    return "sha256:" + h.hexdigest()


if __name__ == "__main__":
    print(fingerprint(json.load(sys.stdin)))
