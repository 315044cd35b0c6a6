#!/usr/bin/env bash
# npm start: installs what is missing, starts PostgreSQL, migrates, seeds the demo once, starts
# the local fakes, builds and serves Pincer. Ctrl-C or SIGTERM stops everything it started.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
source "$ROOT/scripts/env.sh"
source "$ROOT/scripts/fakes.sh"
cd "$ROOT"

ensure_postgres
ensure_node_modules
mkdir -p "$ROOT/.data"
ensure_env_file
load_env

port_in_use "$PORT" && die "port $PORT on $HOST is taken; stop what uses it or set PORT"

SERVER_PID=""
DB_STARTED=""
cleanup() {
	set +e
	trap - INT TERM EXIT
	if [ -n "$SERVER_PID" ]; then
		kill -TERM "$SERVER_PID" 2>/dev/null
		wait "$SERVER_PID" 2>/dev/null
	fi
	stop_fakes
	[ -n "$DB_STARTED" ] && bash "$ROOT/scripts/db.sh" stop
	say "stopped"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

bash "$ROOT/scripts/db.sh" start
DB_STARTED=1
node_modules/.bin/tsx scripts/migrate.ts || die "migrations failed; the data folder .data/pg is untouched"
node_modules/.bin/tsx --tsconfig scripts/tsconfig.json scripts/seed.ts || die "seeding the demo workspace failed"
start_fakes

stamp="$ROOT/build/.built-at"
if [ ! -f "$stamp" ] || [ -n "$(find src static drizzle package-lock.json svelte.config.js vite.config.ts tailwind.config.ts -newer "$stamp" -print -quit)" ]; then
	say "building"
	node_modules/.bin/vite build --logLevel error >"$ROOT/.data/build.log" 2>&1 || die "build failed; see .data/build.log"
	touch "$stamp"
fi

# One server process per core (PINCER_WORKERS to choose): see scripts/serve.js.
node scripts/serve.js &
SERVER_PID=$!
for _ in $(seq 1 100); do
	curl -fsS "http://$HOST:$PORT/healthz" >/dev/null 2>&1 && break
	kill -0 "$SERVER_PID" 2>/dev/null || die "the server exited during start-up"
	sleep 0.1
done

cat >&2 <<BANNER

  Pincer is serving at  http://$HOST:$PORT
  Health                http://$HOST:$PORT/healthz
$(node_modules/.bin/tsx scripts/demo/banner.ts)
  Stop with Ctrl-C.

BANNER
wait "$SERVER_PID"
