"""pandas in and out: a DataFrame as data, results as DataFrames (skipped without pandas)."""
import math
import unittest

try:
    import pandas as pd
except ImportError:  # pandas is optional: these paths are tested where it is installed
    pd = None

from parsimetry_client import Client, columns_from_frame

from service import TILES, base_url, run_label


@unittest.skipIf(pd is None, "pandas is not installed: the DataFrame paths are not tested here")
class FrameInTest(unittest.TestCase):
    def test_columns_numbers_text_and_missing(self):
        frame = pd.DataFrame({
            "y": [1.5, float("nan"), 3.0],
            "n": pd.array([1, None, 3], dtype="Int64"),
            "kiln": pd.Categorical(["east", None, "west"]),
            "batch": ["a", None, "c"],
            "glazed": [True, False, True],
            "coded": pd.Categorical([1, 2, 1]),
        })
        self.assertEqual(columns_from_frame(frame), {
            "y": [1.5, None, 3.0],
            "n": [1, None, 3],
            "kiln": ["east", None, "west"],
            "batch": ["a", None, "c"],
            "glazed": ["true", "false", "true"],
            "coded": ["1", "2", "1"],
        })

    def test_dates_are_refused_by_name(self):
        with self.assertRaises(TypeError) as caught:
            columns_from_frame(pd.DataFrame({"fired": pd.to_datetime(["2026-01-01", "2026-01-02"])}))
        self.assertIn("fired", str(caught.exception))


@unittest.skipIf(pd is None, "pandas is not installed: the DataFrame paths are not tested here")
class FrameLiveTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.client = Client(base_url())
        cls.tiles = pd.read_csv(TILES)

    def test_a_data_frame_compares_like_its_columns(self):
        candidates = [{"name": "line", "terms": ["peakTemp"]}, {"name": "with-kiln", "terms": ["peakTemp", "kiln"]}]
        frame = self.tiles.copy()
        frame["kiln"] = frame["kiln"].astype("category")
        frame.loc[2, "peakTemp"] = float("nan")
        by_frame = self.client.compare({"label": run_label("frame"), "data": frame, "response": "shrinkage", "candidates": candidates})
        as_lists = {c: [None if (isinstance(v, float) and math.isnan(v)) else v for v in frame[c].astype(object)] for c in frame.columns}
        by_lists = self.client.compare({"data": {"columns": as_lists}, "response": "shrinkage", "candidates": candidates})
        self.assertEqual(by_frame["dataset"]["rowsDropped"], 1)
        self.assertEqual(by_frame["dataset"]["fingerprint"], by_lists["dataset"]["fingerprint"])

    def test_results_as_data_frames(self):
        from parsimetry_client.frames import coefficients_frame, models_frame, rankings_frame

        result = self.client.compare({"data": self.tiles, "response": "shrinkage", "candidates": [
            {"name": "line", "terms": ["peakTemp"]}, {"name": "with-kiln", "terms": ["peakTemp", "kiln"]}]})
        ranking = rankings_frame(result)
        self.assertEqual(list(ranking["rank"]), [1, 2])
        self.assertAlmostEqual(ranking["weight"].sum(), 1.0, delta=1e-12)
        self.assertEqual(list(rankings_frame(result, "bic")["name"]), [e["name"] for e in result["rankings"]["bic"]])
        models = models_frame(result)
        self.assertEqual(models.loc["line", "aic"], next(m["aic"] for m in result["models"] if m["name"] == "line"))
        coefficients = coefficients_frame(self.client.comparison(result["id"]))
        self.assertEqual(len(coefficients), 2 + 1 + len(self.tiles["kiln"].unique()))
        self.assertEqual(set(coefficients["model"]), {"line", "with-kiln"})
        with self.assertRaises(KeyError):
            rankings_frame(result, "r2")


if __name__ == "__main__":
    unittest.main()
