"""What the tests share: the live service's address and the example data (examples/tiles.csv)."""
import csv
import os
import time
import uuid
from pathlib import Path

TILES = Path(__file__).resolve().parents[3] / "examples" / "tiles.csv"


def base_url() -> str:
    url = os.environ.get("PARSIMETRY_URL")
    if not url:
        raise RuntimeError("set PARSIMETRY_URL to a running parsimetry service (the repository's "
                           "`npx tap test/clients/python.test.ts` starts one)")
    return url


def tiles_columns():
    with TILES.open(newline="") as f:
        rows = list(csv.DictReader(f))
    return {name: [r[name] if name == "kiln" else float(r[name]) for r in rows] for name in rows[0]}


def run_label(what: str) -> str:
    """A label no other run shares, so listings can be filtered to this run's records."""
    return f"py-client {what} {time.time_ns()}-{uuid.uuid4().hex[:8]}"
