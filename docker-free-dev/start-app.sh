#!/usr/bin/env bash
# npm start: installs what is missing, starts the local services, migrates, loads the demo data,
# builds and serves Roundmark on http://127.0.0.1:$ROUNDMARK_APP_PORT (default 4321).
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

if port_busy "$ROUNDMARK_APP_PORT"; then
  fail "port $ROUNDMARK_APP_PORT is already in use, so Roundmark cannot start there. Stop the program using it (for example: fuser -k $ROUNDMARK_APP_PORT/tcp) or start on another port with ROUNDMARK_APP_PORT=4322 npm start."
fi

bash docker-free-dev/ensure-system.sh
bash docker-free-dev/services.sh up
npx tsx src/scripts/migrate.ts
npx tsx src/scripts/seed.ts
bash docker-free-dev/build-if-stale.sh

export HOST=127.0.0.1 PORT="$ROUNDMARK_APP_PORT" NODE_ENV=production
export ROUNDMARK_MAIL_PREVIEW=1 # local only: the owner's /studio/mail page lists what the mail fake caught; production never sets it
# Job workers run beside the server and stop with it: ROUNDMARK_WORKERS of them (default 1), each
# taking ROUNDMARK_MEDIA_CONCURRENCY media jobs at a time; ROUNDMARK_APP_PROCESSES web processes share the port.
workers=()
for ((i = 1; i <= ${ROUNDMARK_WORKERS:-1}; i++)); do
  log="$RUN/worker.log"; [ "$i" = 1 ] || log="$RUN/worker-$i.log"
  npx tsx src/worker.ts >"$log" 2>&1 &
  workers+=($!)
done
trap 'kill "${workers[@]}" 2>/dev/null; wait "${workers[@]}" 2>/dev/null' EXIT INT TERM
say "Roundmark is starting on $PUBLIC_BASE_URL (demo accounts in README.md); the job worker logs to .data/run/worker.log."
say "Ctrl+C stops the app and the worker; 'npm run services -- down' stops the services."
node "${ROUNDMARK_DIST:-dist}/serve.mjs" # src/serve.ts, compiled by the build
