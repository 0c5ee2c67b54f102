#!/usr/bin/env bash
# Tests the Python client (examples/notebook/ampwalk_client.py) against the
# real bridge: builds examples/bridge once, then runs test_client.py with the
# machine's python3 (standard library only; numpy is used when present).
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
repo="$(cd "$here/../.." && pwd)"
py=/usr/bin/python3
[ -x "$py" ] || py="$(command -v python3)"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
(cd "$repo" && go build -o "$tmp/ampwalk-bridge" ./examples/bridge)
cd "$here"
AMPWALK_BRIDGE="$tmp/ampwalk-bridge" PYTHONDONTWRITEBYTECODE=1 "$py" -m unittest -v test_client
