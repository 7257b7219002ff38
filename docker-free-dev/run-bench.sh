#!/usr/bin/env bash
# npm run bench: each benchmark prints its figures and a baseline measured in the same run.
# BENCH_QUICK=1 shortens the media benchmark (30 s clip instead of 5 minutes).
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
bash docker-free-dev/ensure-system.sh
bash docker-free-dev/services.sh up >/dev/null
bash docker-free-dev/build-if-stale.sh
# `npm run bench -- bench/marking-bench.ts` runs only the benchmarks named.
BENCHES=("$@")
[ ${#BENCHES[@]} -gt 0 ] || BENCHES=(bench/timing-check-bench.ts bench/library-bench.ts bench/viewers-bench.ts bench/upload-bench.ts bench/package-bench.ts bench/marking-bench.ts)
for bench in "${BENCHES[@]}"; do
  say "== $bench"
  npx tsx "$bench" 2> >(grep -v -e NodeVersionSupportWarning -e 'node >=22' -e 'a.co/' -e 'trace-warnings' -e '^$' -e 'versions published' -e 'will require' -e 'To continue' -e 'security updates' >&2)
done
