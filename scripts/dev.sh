#!/usr/bin/env bash
# npm run dev: the same set-up as npm start, then Vite's dev server with hot reload.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
source "$ROOT/scripts/env.sh"
source "$ROOT/scripts/fakes.sh"
cd "$ROOT"

ensure_postgres
ensure_node_modules
mkdir -p "$ROOT/.data"
ensure_env_file
PORT="${PORT:-5173}" load_env

cleanup() {
	set +e
	trap - INT TERM EXIT
	stop_fakes
	bash "$ROOT/scripts/db.sh" stop
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

bash "$ROOT/scripts/db.sh" start
node_modules/.bin/tsx scripts/migrate.ts || die "migrations failed"
node_modules/.bin/tsx --tsconfig scripts/tsconfig.json scripts/seed.ts || die "seeding the demo workspace failed"
start_fakes
node_modules/.bin/vite dev --host "$HOST" --port "$PORT" &
wait $!
