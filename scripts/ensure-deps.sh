#!/usr/bin/env bash
# Installs node_modules with `npm ci` when it is missing or older than the lock file.
set -euo pipefail
stamp=node_modules/.swardkeep-lock
if [ -f "$stamp" ] && cmp -s package-lock.json "$stamp"; then exit 0; fi
echo "setup: installing npm dependencies (npm ci)"
npm ci --no-audit --no-fund --loglevel=error
cp package-lock.json "$stamp"
