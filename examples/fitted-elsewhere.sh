#!/usr/bin/env bash
# Score a straight line fitted in awk against two models the service fits,
# all under one convention. Needs bash, awk and curl.
#   PARSIMETRY_URL=http://127.0.0.1:8080 bash examples/fitted-elsewhere.sh
set -euo pipefail
url="${PARSIMETRY_URL:-http://127.0.0.1:8080}"
csv="$(dirname "$0")/tiles.csv"

# Least squares of shrinkage (column 5) on peakTemp (column 1), and its RSS.
read -r n rss < <(awk -F, 'NR > 1 { n++; x[n] = $1; y[n] = $5; sx += $1; sy += $5 }
  END { mx = sx / n; my = sy / n
        for (i = 1; i <= n; i++) { sxy += (x[i] - mx) * (y[i] - my); sxx += (x[i] - mx) ^ 2 }
        b = sxy / sxx; a = my - b * mx
        for (i = 1; i <= n; i++) rss += (y[i] - a - b * x[i]) ^ 2
        printf "%d %.17g\n", n, rss }' "$csv")

# The data as JSON columns, so the service can fit its own candidates on the same rows.
columns="$(awk -F, 'NR > 1 { t = t sep $1; m = m sep $3; k = k sep "\"" $4 "\""; s = s sep $5; sep = "," }
  END { printf "{\"peakTemp\":[%s],\"moisture\":[%s],\"kiln\":[%s],\"shrinkage\":[%s]}", t, m, k, s }' "$csv")"

curl -sS --fail-with-body "$url/v1/comparisons" -H 'content-type: application/json' -d @- <<JSON
{
  "label": "awk line versus service fits",
  "data": { "columns": $columns },
  "response": "shrinkage",
  "candidates": [
    { "name": "line-from-awk", "rss": $rss, "parameters": 3, "observations": $n },
    { "name": "moisture-and-kiln", "terms": ["peakTemp", "moisture", "kiln"] },
    { "name": "curved", "terms": ["peakTemp", { "kind": "power", "of": "peakTemp", "degree": 2 }, "moisture", "kiln"] }
  ]
}
JSON
echo
