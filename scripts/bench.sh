#!/usr/bin/env bash
# npm run bench [-- name …]: runs the benchmarks in bench/ (all, or those named), each printing its
# numbers next to a reference tool run in the same process (exiftool, vipsthumbnail, zip -0).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-node-modules.sh
node_modules/.bin/tsx scripts/ensure-tools.ts exiftool vips unzip
names=("$@")
if [ ${#names[@]} -eq 0 ]; then names=(grouping metadata previews bundle); fi
for name in "${names[@]}"; do
  echo "== bench/${name}.bench.ts"
  node_modules/.bin/tsx "bench/${name}.bench.ts"
done
