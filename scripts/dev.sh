#!/usr/bin/env bash
# npm run dev: services as for npm start, the API and worker in watch mode, Vite with HMR.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-node-modules.sh
exec node_modules/.bin/tsx scripts/start.ts --dev "$@"
