# Shared helpers for the docker-free-dev scripts. Sourced, not run.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA="$ROOT/.data"
RUN="$DATA/run"
mkdir -p "$DATA" "$RUN"
PG_BIN=/usr/lib/postgresql/15/bin
checkout_hash() { printf '%s' "$ROOT" | sha1sum | cut -c1-10; }
# PostgreSQL runs as its own daemon and can outlive a session, so each checkout gets a port of its
# own (54000-54899, from the checkout path): a cluster left running elsewhere never blocks this one.
ROUNDMARK_PG_PORT=${ROUNDMARK_PG_PORT:-$((54000 + 0x$(checkout_hash | cut -c1-6) % 900))}
set -a
# shellcheck source=local.env
source "$ROOT/docker-free-dev/local.env"
set +a

say()  { printf '%s\n' "$*"; }
fail() { printf 'roundmark: %s\n' "$*" >&2; exit 1; }

# True when something accepts TCP connections on 127.0.0.1:$1.
port_busy() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# Waits up to $2 seconds for 127.0.0.1:$1 to accept connections.
wait_port() {
  local port=$1 secs=${2:-20} i
  for ((i = 0; i < secs * 10; i++)); do port_busy "$port" && return 0; sleep 0.1; done
  return 1
}

pid_alive() { [ -f "$1" ] && kill -0 "$(cat "$1")" 2>/dev/null; }

# The PostgreSQL cluster lives in a folder the postgres user owns, named per checkout, because a
# checkout may sit under a folder that user cannot traverse (CI clones into mktemp -d folders).
PG_HOME="/var/lib/postgresql/roundmark-$(checkout_hash)"
