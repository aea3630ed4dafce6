#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL/Redis/mail catcher, migrate, seed, build, run.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-node-modules.sh
exec node_modules/.bin/tsx scripts/start.ts "$@"
