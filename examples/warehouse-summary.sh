#!/usr/bin/env bash
# Data too large to send: reduce a table to its summary inside PostgreSQL and
# post only the summary. Needs psql, curl and a running service.
#   PARSIMETRY_URL=http://127.0.0.1:8080 DATABASE_URL=postgres://... bash examples/warehouse-summary.sh
set -euo pipefail
url="${PARSIMETRY_URL:-http://127.0.0.1:8080}"
db="${DATABASE_URL:?set DATABASE_URL to a PostgreSQL connection URL}"
here="$(dirname "$0")"

# A table where the data live (here: loaded from the example CSV).
psql -q "$db" -v ON_ERROR_STOP=1 <<'SQL'
DROP TABLE IF EXISTS tiles_example;
CREATE TABLE tiles_example ("peakTemp" double precision, "holdMinutes" double precision,
  moisture double precision, kiln text, shrinkage double precision);
SQL
psql -q "$db" -v ON_ERROR_STOP=1 -c "\copy tiles_example FROM '$here/tiles.csv' WITH (FORMAT csv, HEADER true)"

# One query computes rows, means and centred cross products where the data live.
data="$(npx --no-install tsx scripts/summary-sql.ts --postgres-json tiles_example peakTemp moisture shrinkage | psql -At "$db" -v ON_ERROR_STOP=1)"

curl -sS --fail-with-body "$url/v1/comparisons" -H 'content-type: application/json' -d @- <<JSON
{
  "label": "tiles from the warehouse, by summary",
  "data": $data,
  "response": "shrinkage",
  "candidates": [
    { "name": "temperature", "terms": ["peakTemp"] },
    { "name": "temperature-and-moisture", "terms": ["peakTemp", "moisture"] }
  ]
}
JSON
echo
