#!/usr/bin/env bash
# The tests need Debian's PostgreSQL 15 and Chromium; install whichever is missing.
set -euo pipefail
here=$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)
bash "$here/../../db/ensure-postgres.sh"
if ! command -v chromium >/dev/null 2>&1 && [ ! -x /usr/bin/chromium ]; then
  echo "tests: Chromium is not installed; installing Debian's chromium package..." >&2
  as_root=()
  if [ "$(id -u)" -ne 0 ]; then
    if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then as_root=(sudo -n); else
      echo "tests: cannot install chromium without root. Run: sudo apt-get install -y chromium" >&2
      exit 1
    fi
  fi
  export DEBIAN_FRONTEND=noninteractive
  if ! "${as_root[@]}" apt-get install -y --no-install-recommends chromium >/dev/null 2>&1; then
    "${as_root[@]}" apt-get update -qq >/dev/null 2>&1 || true
    "${as_root[@]}" apt-get install -y --no-install-recommends chromium >/dev/null
  fi
fi
