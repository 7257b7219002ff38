#!/usr/bin/env bash
# Builds the app when dist/ is missing or older than any source file, so a second start is quick.
# The build also compiles the web server (src/serve.ts -> $out/serve.mjs) and precompresses the
# client files (src/build/production-server.ts), so production runs plain JavaScript.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
out="${ROUNDMARK_DIST:-dist}" # a second test run on one machine can build elsewhere
stamp="$out/.roundmark-build"
if [ -f "$stamp" ] && [ -f "$out/serve.mjs" ] && [ -z "$(find src public astro.config.mjs package-lock.json -newer "$stamp" -print -quit)" ]; then
  exit 0
fi
say "Building the app"
npx astro build --outDir "$out" >"$DATA/build.log" 2>&1 || { tail -30 "$DATA/build.log" >&2; fail "the build failed (last lines above)"; }
touch "$stamp"
