"""What needs no service: the request on the wire (to a recording server), problems that are not
problem+json, the event-stream reader and the JSON preparation of requests."""
import io
import json
import threading
import unittest
from http.server import BaseHTTPRequestHandler, HTTPServer

from parsimetry_client import Client, ParsimetryError, UnreadableRecordsError
from parsimetry_client.columns import prepared
from parsimetry_client.events import server_events


class Recorder(BaseHTTPRequestHandler):
    seen = []
    answer = (200, "application/json", b'{"records": [], "unreadable": [], "nextCursor": null}')

    def do_GET(self):  # noqa: N802 - the standard library's name
        Recorder.seen.append((self.path, dict(self.headers)))
        status, kind, body = Recorder.answer
        self.send_response(status)
        self.send_header("content-type", kind)
        self.send_header("content-length", str(len(body)))
        self.end_headers()
        self.wfile.write(body)

    def log_message(self, *args):
        pass


class WireTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.server = HTTPServer(("127.0.0.1", 0), Recorder)
        threading.Thread(target=cls.server.serve_forever, daemon=True).start()
        cls.url = f"http://127.0.0.1:{cls.server.server_port}/api/"

    @classmethod
    def tearDownClass(cls):
        cls.server.shutdown()
        cls.server.server_close()

    def setUp(self):
        Recorder.seen.clear()
        Recorder.answer = (200, "application/json", b'{"records": [], "unreadable": [], "nextCursor": null}')

    def test_key_as_bearer_base_path_kept_query_encoded(self):
        Client(self.url, api_key="k-123").list_page(label="kiln & press", page_size=5)
        path, headers = Recorder.seen[0]
        self.assertEqual(path, "/api/v1/comparisons?label=kiln+%26+press&limit=5")
        self.assertEqual(headers.get("Authorization"), "Bearer k-123")

    def test_no_key_no_authorization(self):
        Client(self.url).list_page()
        self.assertNotIn("Authorization", Recorder.seen[0][1])

    def test_an_answer_that_is_not_a_problem_still_raises_with_its_status(self):
        Recorder.answer = (502, "text/html", b"<html>bad gateway</html>")
        with self.assertRaises(ParsimetryError) as caught:
            Client(self.url).verify()
        self.assertEqual(caught.exception.status, 502)
        self.assertIn("bad gateway", caught.exception.detail)

    def test_list_raises_on_damaged_rows_unless_the_caller_takes_them(self):
        Recorder.answer = (200, "application/json", json.dumps({
            "records": [{"id": "a", "seq": 7}], "unreadable": [{"seq": 6, "id": None}], "nextCursor": None}).encode())
        seen = []
        with self.assertRaisesRegex(UnreadableRecordsError, "chain positions 6"):
            for record in Client(self.url).list():
                seen.append(record["id"])
        self.assertEqual(seen, ["a"], "the readable records of the page come first")
        taken = []
        self.assertEqual([r["id"] for r in Client(self.url).list(on_unreadable=taken.extend)], ["a"])
        self.assertEqual(taken, [{"seq": 6, "id": None}])


class BaseUrlTest(unittest.TestCase):
    def test_a_base_url_that_is_not_absolute_http_is_refused_by_name(self):
        for url in ("", "/v1", "ftp://x", "http://"):
            with self.assertRaisesRegex(ValueError, r"^base_url: an absolute http\(s\) URL"):
                Client(url)


class EventsTest(unittest.TestCase):
    def test_line_endings_comments_and_several_data_lines(self):
        text = ': a comment\r\nevent: one\r\ndata: {"a":\r\ndata: 1}\r\n\r\nevent: two\rdata: "é"\r\rdata: plain\n\n'
        events = list(server_events(io.BufferedReader(io.BytesIO(text.encode("utf-8")), buffer_size=1)))
        self.assertEqual(events, [("one", '{"a":\n1}'), ("two", '"é"'), ("message", "plain")])


class PreparedTest(unittest.TestCase):
    def test_nan_is_null_and_infinity_refused_with_its_path(self):
        request = {"data": {"columns": {"x": [1.0, float("nan"), 3], "k": ("a", None, "b")}}}
        self.assertEqual(prepared(request), {"data": {"columns": {"x": [1.0, None, 3], "k": ["a", None, "b"]}}})
        with self.assertRaises(ValueError) as caught:
            prepared({"candidates": [{"name": "m", "rss": float("inf")}]})
        self.assertIn("candidates/0/rss", str(caught.exception))

    def test_booleans_stay_booleans_outside_data(self):
        self.assertEqual(json.loads(json.dumps(prepared({"hierarchy": True, "top": 5}))), {"hierarchy": True, "top": 5})


if __name__ == "__main__":
    unittest.main()
