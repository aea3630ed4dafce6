#!/usr/bin/env bash
# npm run seed [-- --reset]: (re)creates the demo studio in the database npm start uses.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-node-modules.sh
exec node_modules/.bin/tsx scripts/start.ts --seed-only "$@"
