"""A small client for Lossline's machine API, on Python's standard library only.

It does what a site's scheduled export job needs: send a historian export, wait until Lossline has
read it, and fetch a unit's hourly exergy balance as CSV. Use it as a module or from the shell:

    export LOSSLINE_URL=https://lossline.example.internal LOSSLINE_TOKEN=...   # a site API token
    python3 lossline_client.py upload --site SITE_ID export.csv --wait
    python3 lossline_client.py hours --unit UNIT_ID --from 2026-11-01T00:00Z --to 2026-12-01T00:00Z > hours.csv

The token is sent as `Authorization: Bearer ...`; it belongs to one site (see docs/api.md).
"""

from __future__ import annotations

import argparse
import csv
import io
import json
import os
import sys
import time
import urllib.error
import urllib.parse
import urllib.request
from typing import Any, Dict, List, Optional

# Upload states after which nothing more happens without a person (see docs/api.md).
FINAL_UPLOAD_STATES = {"done", "read-with-problems", "failed", "needs-review"}


class LosslineError(Exception):
    """An answer other than 2xx: the HTTP status, the error's stable code and its message."""

    def __init__(self, status: int, code: str, message: str, issues: Optional[list] = None):
        super().__init__(f"{status} {code}: {message}")
        self.status = status
        self.code = code
        self.message = message
        self.issues = issues or []


def _error_from(status: int, body: bytes) -> LosslineError:
    try:
        err = json.loads(body.decode("utf-8")).get("error")
    except (ValueError, AttributeError):
        err = None
    if isinstance(err, dict):
        return LosslineError(status, str(err.get("code", "UNKNOWN")), str(err.get("message", "")), err.get("issues"))
    if isinstance(err, str):  # an older answer shape
        return LosslineError(status, "UNKNOWN", err)
    return LosslineError(status, "UNKNOWN", body[:300].decode("utf-8", "replace"))


class LosslineClient:
    def __init__(self, base_url: str, token: str, timeout_s: float = 120.0):
        self.base_url = base_url.rstrip("/")
        self.token = token
        self.timeout_s = timeout_s

    # -- plumbing -------------------------------------------------------------------------------
    def _request(self, method: str, path: str, query: Optional[Dict[str, str]] = None,
                 data: Any = None, headers: Optional[Dict[str, str]] = None) -> bytes:
        url = self.base_url + path
        if query:
            url += "?" + urllib.parse.urlencode(query)
        req = urllib.request.Request(url, data=data, method=method)
        req.add_header("Authorization", f"Bearer {self.token}")
        for k, v in (headers or {}).items():
            req.add_header(k, v)
        try:
            with urllib.request.urlopen(req, timeout=self.timeout_s) as res:
                return res.read()
        except urllib.error.HTTPError as e:
            raise _error_from(e.code, e.read()) from None

    def _json(self, method: str, path: str, **kw: Any) -> Any:
        return json.loads(self._request(method, path, **kw).decode("utf-8"))

    # -- files ----------------------------------------------------------------------------------
    def upload_file(self, site_id: str, path: str, name: Optional[str] = None) -> Dict[str, Any]:
        """Sends one export; the body streams from disk. Answers {uploadId, duplicateOf}."""
        size = os.path.getsize(path)
        with open(path, "rb") as f:
            return self._json(
                "POST", f"/api/v1/sites/{urllib.parse.quote(site_id)}/files",
                query={"name": name or os.path.basename(path)}, data=f,
                headers={"Content-Type": "text/csv", "Content-Length": str(size)},
            )

    def upload_status(self, upload_id: str) -> Dict[str, Any]:
        return self._json("GET", f"/api/v1/uploads/{urllib.parse.quote(upload_id)}")

    def wait_for_upload(self, upload_id: str, timeout_s: float = 900.0, poll_s: float = 2.0) -> Dict[str, Any]:
        """Polls until the upload is read (or stops for a person); answers its last status."""
        deadline = time.monotonic() + timeout_s
        while True:
            status = self.upload_status(upload_id)
            if status.get("status") in FINAL_UPLOAD_STATES:
                return status
            if time.monotonic() > deadline:
                raise TimeoutError(f"upload {upload_id} still {status.get('status')} after {timeout_s:.0f} s")
            time.sleep(poll_s)

    def site_state(self, site_id: str) -> Dict[str, Any]:
        """The site's processing state: files waiting or being read, hours to compute, drift checks; settled."""
        return self._json("GET", f"/api/v1/sites/{urllib.parse.quote(site_id)}/state")

    def wait_until_settled(self, site_id: str, timeout_s: float = 900.0, poll_s: float = 2.0) -> Dict[str, Any]:
        """Polls until the site's figures are final for everything it was sent (state.settled); answers the state."""
        deadline = time.monotonic() + timeout_s
        while True:
            state = self.site_state(site_id)
            if state.get("settled"):
                return state
            if time.monotonic() > deadline:
                raise TimeoutError(f"site {site_id} not settled after {timeout_s:.0f} s: {state}")
            time.sleep(poll_s)

    # -- results --------------------------------------------------------------------------------
    def unit_hours_csv(self, unit_id: str, start: str, end: str) -> str:
        """A unit's hours starting in [start, end) as CSV text (ISO 8601 instants)."""
        body = self._request("GET", f"/api/v1/units/{urllib.parse.quote(unit_id)}/hours",
                             query={"from": start, "to": end, "format": "csv"}, headers={"Accept": "text/csv"})
        return body.decode("utf-8")

    def unit_hours(self, unit_id: str, start: str, end: str) -> List[Dict[str, str]]:
        """The same hours as a list of rows (column name to text)."""
        return list(csv.DictReader(io.StringIO(self.unit_hours_csv(unit_id, start, end))))


def _main(argv: List[str]) -> int:
    p = argparse.ArgumentParser(description="Send exports to Lossline and fetch unit hours.")
    p.add_argument("--url", default=os.environ.get("LOSSLINE_URL", "http://127.0.0.1:4321"))
    p.add_argument("--token", default=os.environ.get("LOSSLINE_TOKEN"))
    sub = p.add_subparsers(dest="command", required=True)
    up = sub.add_parser("upload", help="send one export file")
    up.add_argument("--site", required=True)
    up.add_argument("file")
    up.add_argument("--name")
    up.add_argument("--wait", action="store_true", help="wait until it is read")
    up.add_argument("--settle", action="store_true", help="then wait until the site's figures are final")
    hours = sub.add_parser("hours", help="a unit's hours as CSV on standard output")
    hours.add_argument("--unit", required=True)
    hours.add_argument("--from", dest="start", required=True)
    hours.add_argument("--to", dest="end", required=True)
    args = p.parse_args(argv)
    if not args.token:
        p.error("a site API token is needed: --token or LOSSLINE_TOKEN")
    client = LosslineClient(args.url, args.token)
    try:
        if args.command == "upload":
            sent = client.upload_file(args.site, args.file, args.name)
            out = client.wait_for_upload(sent["uploadId"]) if args.wait or args.settle else sent
            if args.settle and out.get("status") in ("done", "read-with-problems"):
                client.wait_until_settled(args.site)
            json.dump(out, sys.stdout, indent=2)
            sys.stdout.write("\n")
            return 0 if not (args.wait or args.settle) or out.get("status") == "done" else 3
        sys.stdout.write(client.unit_hours_csv(args.unit, args.start, args.end))
        return 0
    except LosslineError as e:
        sys.stderr.write(f"lossline: {e}\n")
        return 2
    except urllib.error.URLError as e:
        sys.stderr.write(f"lossline: cannot reach {args.url}: {e.reason}\n")
        return 2


if __name__ == "__main__":
    sys.exit(_main(sys.argv[1:]))
