#!/usr/bin/env bash
# Installs the Debian packages Roundmark needs when they are missing, and node_modules when
# absent or older than package-lock.json. Safe to run again: it only acts on what is missing.
source "$(dirname "$0")/lib.sh"

need=()
[ -x "$PG_BIN/postgres" ] || need+=(postgresql)
command -v ffmpeg >/dev/null || need+=(ffmpeg)
# espeak-ng speaks the coach voices of generated test and demo recordings.
command -v espeak-ng >/dev/null || need+=(espeak-ng)
[ -x /usr/bin/chromium ] || need+=(chromium)
[ -f /usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf ] || need+=(fonts-dejavu-core)
if [ ${#need[@]} -gt 0 ]; then
  say "Installing Debian packages: ${need[*]}"
  [ "$(id -u)" = 0 ] || fail "installing ${need[*]} needs root (run as root or install them first)"
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${need[@]}" >"$DATA/apt.log" 2>&1 \
    || { tail -20 "$DATA/apt.log" >&2; fail "apt-get install ${need[*]} failed (log above)"; }
fi

# npm ci when node_modules is missing or was installed from another lock file.
stamp="$ROOT/node_modules/.roundmark-lock"
lock_sum=$(sha1sum "$ROOT/package-lock.json" | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$lock_sum" ]; then
  say "Installing npm packages (npm ci)"
  (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error) || fail "npm ci failed"
  printf '%s' "$lock_sum" >"$stamp"
fi
