#!/usr/bin/env bash
# npm run bench [-- --faults | --sizes ... ]
#   (no option)   the engine against pandas + numpy, then the pipeline, the health probes under load and the 1 GiB capture
#   --faults      only the full fault run (PostgreSQL 60 s, object store 60 s, Redis 30 s down, worker kill -9)
#   --hosts [...] only the workers-on-other-hosts run (scripts/hosts/run.sh: network namespaces, 1, 2, 4 workers; root)
#   --data-scale  only the pages at 1 000 000 captures (scripts/bench/data-scale/run.sh; its options follow)
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/../.."
if [[ "${1:-}" == "--faults" ]]; then
  exec bash scripts/faults/run.sh
fi
if [[ "${1:-}" == "--hosts" ]]; then
  shift
  exec bash scripts/hosts/run.sh "$@"
fi
if [[ "${1:-}" == "--data-scale" ]]; then
  shift
  exec bash scripts/bench/data-scale/run.sh "$@"
fi
node_modules/.bin/tsx scripts/bench/index.ts "$@"
bash scripts/bench/pipeline.sh
