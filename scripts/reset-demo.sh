#!/usr/bin/env bash
# npm run db:reset: drops the local database and recreates it with migrations and the demo seed.
# Everything in the local workspace database is lost; the cluster itself is kept.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
source "$ROOT/scripts/env.sh"
cd "$ROOT"

ensure_env_file
load_env
port_in_use "$PORT" && die "Pincer seems to be running on port $PORT; stop it first"

was_running=""
bash scripts/db.sh status >/dev/null 2>&1 && was_running=1
bash scripts/db.sh start
PGPASSWORD="$PINCER_DB_SUPERPASSWORD" "$(pg_bindir)/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres \
	-v ON_ERROR_STOP=1 -q -c 'drop database if exists pincer with (force)'
bash scripts/db.sh start
node_modules/.bin/tsx scripts/migrate.ts
node_modules/.bin/tsx --tsconfig scripts/tsconfig.json scripts/seed.ts
[ -n "$was_running" ] || bash scripts/db.sh stop
say "demo data reset"
