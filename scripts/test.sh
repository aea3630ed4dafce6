#!/usr/bin/env bash
# npm test: type-check, lint, build the client, then every vitest project (unit, API, browser).
# The API and browser projects start their own throw-away PostgreSQL, Redis and mail catcher.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-node-modules.sh
node_modules/.bin/tsx scripts/ensure-tools.ts postgresql redis chromium exiftool unzip poppler imagemagick vips
echo "[lamella] type-check" >&2
node_modules/.bin/tsc --noEmit -p tsconfig.json
echo "[lamella] lint" >&2
node_modules/.bin/eslint . --max-warnings=0
echo "[lamella] build client" >&2
node_modules/.bin/vite build --logLevel warn
exec node_modules/.bin/vitest run "$@"
