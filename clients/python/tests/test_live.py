"""The client against a live service: every method; refusals as ParsimetryError with the problem."""
import math
import unittest

from parsimetry_client import Client, ParsimetryError

from service import TILES, base_url, run_label, tiles_columns

COLUMNS = tiles_columns()
N = len(COLUMNS["shrinkage"])


def line_rss(x, y):
    """Least squares of y on x by the closed form, here in the test (not by the service)."""
    mx, my = sum(x) / len(x), sum(y) / len(y)
    b = sum((a - mx) * (c - my) for a, c in zip(x, y)) / sum((a - mx) ** 2 for a in x)
    a0 = my - b * mx
    return sum((c - a0 - b * a) ** 2 for a, c in zip(x, y))


def request(label):
    return {
        "label": label,
        "data": {"columns": COLUMNS},
        "response": "shrinkage",
        "candidates": [
            {"name": "line-by-hand", "rss": line_rss(COLUMNS["peakTemp"], COLUMNS["shrinkage"]), "parameters": 3, "observations": N},
            {"name": "temperature-and-moisture", "terms": ["peakTemp", "moisture"]},
            {"name": "with-kiln", "terms": ["peakTemp", "moisture", "kiln"]},
        ],
    }


def search_request():
    return {
        "data": {"columns": COLUMNS},
        "response": "shrinkage",
        "pool": ["peakTemp", "holdMinutes", "moisture", "kiln", {"kind": "power", "of": "peakTemp", "degree": 2}],
        "top": 5,
    }


class LiveTest(unittest.TestCase):
    client: Client

    @classmethod
    def setUpClass(cls):
        cls.client = Client(base_url())

    def test_compare_under_the_published_convention(self):
        result = self.client.compare(request(run_label("compare")))
        self.assertEqual(result["dataset"]["observations"], N)
        line = next(m for m in result["models"] if m["name"] == "line-by-hand")
        # The convention (README): logL = -n/2 (ln 2π + ln(RSS/n) + 1), AIC = -2 logL + 2k.
        rss = line_rss(COLUMNS["peakTemp"], COLUMNS["shrinkage"])
        log_l = -N / 2 * (math.log(2 * math.pi) + math.log(rss / N) + 1)
        self.assertAlmostEqual(line["logLikelihood"], log_l, delta=1e-9 * abs(log_l))
        self.assertAlmostEqual(line["aic"], -2 * log_l + 6, delta=1e-9 * abs(log_l))
        ranking = result["rankings"][result["conventions"]["rankBy"]]
        self.assertEqual([e["rank"] for e in ranking], [1, 2, 3])
        self.assertEqual(ranking[0]["delta"], 0)
        self.assertAlmostEqual(sum(e["weight"] for e in ranking), 1.0, delta=1e-12)

    def test_refusals_carry_status_and_paths(self):
        bad = request(run_label("refused"))
        bad["response"] = "no-such-column"
        with self.assertRaises(ParsimetryError) as caught:
            self.client.compare(bad)
        error = caught.exception
        self.assertEqual(error.status, 422)
        self.assertEqual(error.problem["status"], 422)
        self.assertIn("response", [e["path"] for e in error.errors])
        self.assertTrue(str(error).startswith("422 "))
        with self.assertRaises(ParsimetryError) as schema:
            self.client.compare({"response": "y"})
        self.assertEqual(schema.exception.status, 400)
        self.assertTrue(schema.exception.errors)
        with self.assertRaises(ParsimetryError) as missing:
            self.client.comparison("00000000-0000-7000-8000-000000000000")
        self.assertEqual(missing.exception.status, 404)

    def test_record_replay_chart_report(self):
        made = self.client.compare(request(run_label("record")))
        stored = self.client.comparison(made["id"])
        self.assertEqual(stored["id"], made["id"])
        self.assertTrue(stored["integrity"]["ok"])
        replay = self.client.replay(made["id"])
        self.assertEqual(replay["changes"], [], "the same code gives the same numbers")
        svg = self.client.chart_svg(made["id"], criterion="bic", size="tile")
        self.assertTrue(svg.startswith("<svg"))
        self.assertIn('data-integrity="ok"', svg)
        html = self.client.report_html(made["id"])
        self.assertTrue(html.lower().startswith("<!doctype html>"))
        self.assertIn("with-kiln", html)
        with self.assertRaises(ParsimetryError) as caught:
            self.client.chart_svg(made["id"], width=10)
        self.assertEqual(caught.exception.status, 400)

    def test_list_follows_the_cursor(self):
        label = run_label("list")
        ids = [self.client.compare(request(label))["id"] for _ in range(3)]
        listed = [item["id"] for item in self.client.list(label=label, page_size=1)]
        self.assertEqual(listed, list(reversed(ids)))
        page = self.client.list_page(label=label, page_size=2)
        self.assertEqual(len(page["records"]), 2)
        self.assertIsInstance(page["nextCursor"], str)
        with self.assertRaises(ParsimetryError) as caught:
            self.client.list_page(cursor="not-a-cursor")
        self.assertEqual(caught.exception.errors[0]["path"], "cursor")

    def test_verify(self):
        report = self.client.verify()
        self.assertTrue(report["ok"])
        self.assertGreaterEqual(report["records"], 1)

    def test_search_and_its_stream_agree(self):
        plain = self.client.search(search_request())
        events = list(self.client.search_stream(search_request()))
        self.assertEqual(events[0][0], "progress")
        self.assertEqual(events[0][1]["total"], 2 ** 5)
        kind, last = events[-1]
        self.assertEqual(kind, "result")
        self.assertEqual(last["evaluated"], plain["evaluated"])
        self.assertEqual([m["aicc"] for m in last["models"]], [m["aicc"] for m in plain["models"]])
        # Closing the generator early closes the stream (the service stops the search).
        stream = self.client.search_stream(search_request())
        self.assertEqual(next(stream)[0], "progress")
        stream.close()
        with self.assertRaises(ParsimetryError) as caught:
            list(self.client.search_stream({**search_request(), "response": "missing"}))
        self.assertEqual(caught.exception.status, 422)

    def test_summarise_then_compare_like_the_rows(self):
        with TILES.open("rb") as f:
            upload = self.client.summarise(f, ["peakTemp", "moisture", "shrinkage"], format="csv")
        self.assertEqual(upload["rowsRead"], N)
        candidates = [{"name": "temperature-and-moisture", "terms": ["peakTemp", "moisture"]}]
        by_summary = self.client.compare({"data": upload["data"], "response": "shrinkage", "candidates": candidates})
        by_rows = self.client.compare({"data": {"columns": COLUMNS}, "response": "shrinkage", "candidates": candidates})
        s, r = by_summary["models"][0]["aicc"], by_rows["models"][0]["aicc"]
        self.assertAlmostEqual(s, r, delta=1e-9 * abs(r))
        ndjson = "\n".join(f'{{"peakTemp": {t}, "shrinkage": {y}}}' for t, y in zip(COLUMNS["peakTemp"], COLUMNS["shrinkage"]))
        chunks = (line.encode() + b"\n" for line in ndjson.split("\n"))
        self.assertEqual(self.client.summarise(chunks, ["peakTemp", "shrinkage"], format="ndjson")["rowsRead"], N)
        with self.assertRaises(ParsimetryError) as caught:
            self.client.summarise("a,b\n1,x\n", ["a", "b"])
        self.assertEqual(caught.exception.status, 400)

    def test_missing_values_as_nan_are_sent_as_null(self):
        columns = {k: list(v) for k, v in COLUMNS.items()}
        columns["moisture"][0] = float("nan")
        result = self.client.compare({"data": {"columns": columns}, "response": "shrinkage",
                                      "candidates": [{"name": "m", "terms": ["moisture"]}]})
        self.assertEqual(result["dataset"]["rowsDropped"], 1)


if __name__ == "__main__":
    unittest.main()
