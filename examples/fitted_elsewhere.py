#!/usr/bin/env python3
"""Send residuals of a model fitted in Python and let the service score it beside
models it fits itself, through the Python client (pip install ./clients/python).

    PARSIMETRY_URL=http://127.0.0.1:8080 python3 examples/fitted_elsewhere.py
"""
import csv
import os

from parsimetry_client import Client, ParsimetryError

client = Client(os.environ.get("PARSIMETRY_URL", "http://127.0.0.1:8080"), api_key=os.environ.get("PARSIMETRY_KEY"))

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "tiles.csv"), newline="") as f:
    rows = list(csv.DictReader(f))
temp = [float(r["peakTemp"]) for r in rows]
moisture = [float(r["moisture"]) for r in rows]
shrinkage = [float(r["shrinkage"]) for r in rows]

# Least squares of shrinkage on moisture alone, by the closed form.
n = len(rows)
mx, my = sum(moisture) / n, sum(shrinkage) / n
slope = sum((x - mx) * (y - my) for x, y in zip(moisture, shrinkage)) / sum((x - mx) ** 2 for x in moisture)
residuals = [y - (my - slope * mx) - slope * x for x, y in zip(moisture, shrinkage)]

try:
    result = client.compare({
        "label": "python residuals versus service fits",
        "data": {"columns": {"peakTemp": temp, "moisture": moisture, "shrinkage": shrinkage}},
        "response": "shrinkage",
        "candidates": [
            # k = 2 coefficients + 1 for the error variance.
            {"name": "moisture-from-python", "residuals": residuals, "parameters": 3},
            {"name": "temperature-and-moisture", "terms": ["peakTemp", "moisture"]},
        ],
    })
except ParsimetryError as refused:  # status, detail and the fields at fault
    raise SystemExit(f"refused: {refused}")

for entry in result["rankings"][result["conventions"]["rankBy"]]:
    print(f'{entry["rank"]}  {entry["name"]:<26} delta={entry["delta"]:.3f}  weight={entry["weight"]:.4f}')
print(result["verdict"]["summary"])
print("record", result["id"])
