#!/usr/bin/env bash
# Makes sure Debian's PostgreSQL 15 server binaries are present; installs them if missing.
# Used by the start command, the tests and CI. Prints what to do when it cannot install.
set -euo pipefail
bindir=/usr/lib/postgresql/15/bin
if [ -x "$bindir/initdb" ] && [ -x "$bindir/pg_ctl" ]; then
  exit 0
fi
echo "dropwise: PostgreSQL 15 is not installed; installing Debian's postgresql-15 package..." >&2
as_root=()
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
    as_root=(sudo -n)
  else
    echo "dropwise: cannot install postgresql-15 without root. Run: sudo apt-get install -y --no-install-recommends postgresql-15" >&2
    exit 1
  fi
fi
export DEBIAN_FRONTEND=noninteractive
if ! "${as_root[@]}" apt-get install -y --no-install-recommends postgresql-15 >/dev/null 2>&1; then
  "${as_root[@]}" apt-get update -qq >/dev/null 2>&1 || true
  if ! "${as_root[@]}" apt-get install -y --no-install-recommends postgresql-15 >/dev/null; then
    echo "dropwise: installing postgresql-15 failed. Check that Debian's package mirrors are reachable, or install it by hand." >&2
    exit 1
  fi
fi
# The package starts the system cluster on 5432; Dropwise never uses it.
echo "dropwise: postgresql-15 installed." >&2
