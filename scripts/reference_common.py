"""
What every reference script under scripts/ does at its end: write its JSON document into
tests/fixtures/ (with a final newline), and say which Debian package version it ran with.

    from reference_common import debian_version, write_fixture
    write_fixture("ar1-reference.json", doc, indent=None)
"""

import json
import os
import subprocess

FIXTURES = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "tests", "fixtures")


def fixture_path(name):
    """The path of a file in tests/fixtures/."""
    return os.path.join(FIXTURES, name)


def write_fixture(name, doc, indent=1):
    """Writes doc as JSON to tests/fixtures/<name> (or to name when it is a path); returns the path."""
    path = name if os.path.isabs(name) else fixture_path(name)
    with open(path, "w", encoding="utf-8") as f:
        json.dump(doc, f, indent=indent)
        f.write("\n")
    return path


def debian_version(package="python3-iapws"):
    """The installed version of a Debian package, or 'unknown' (informative only)."""
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", package], capture_output=True, text=True, check=True).stdout.strip()
    except Exception:  # noqa: BLE001 - the version is informative only
        return "unknown"
