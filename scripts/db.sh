#!/usr/bin/env bash
# PostgreSQL lifecycle for a project-local cluster: start | stop | status.
#   PINCER_PGDATA  data folder (default .data/pg)    PGPORT  TCP port (default 54329)
#   PINCER_DB_PASSWORD / PINCER_DB_SUPERPASSWORD     passwords of the app role and the superuser
# Debian's server refuses to run as root, so every server command runs as the postgres user.
# Every command is idempotent: start on a running cluster and stop on a stopped one do nothing.
set -euo pipefail
source "$(dirname "$0")/lib.sh"

DATA="${PINCER_PGDATA:-$ROOT/.data/pg}"
PORT="${PGPORT:-54329}"
DB_NAME="${PINCER_DB_NAME:-pincer}"
BIN="$(pg_bindir)" || die "PostgreSQL is not installed (run npm start, which installs it)"

as_pg() { (cd / && runuser -u postgres -- "$@"); }

is_running() { [ -f "$DATA/postmaster.pid" ] && as_pg "$BIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1; }

superuser_sql() {
	PGPASSWORD="$PINCER_DB_SUPERPASSWORD" "$BIN/psql" -h 127.0.0.1 -p "$PORT" -U postgres \
		-d postgres -v ON_ERROR_STOP=1 -qtA "$@"
}

init_cluster() {
	: "${PINCER_DB_SUPERPASSWORD:?PINCER_DB_SUPERPASSWORD must be set to create a cluster}"
	say "creating PostgreSQL cluster in $DATA"
	mkdir -p "$DATA"
	# postgres must be able to traverse every parent folder.
	local dir="$(dirname "$DATA")"
	while [ "$dir" != "/" ]; do chmod o+x "$dir" 2>/dev/null || true; dir="$(dirname "$dir")"; done
	chown postgres:postgres "$DATA"
	chmod 700 "$DATA"
	local pwfile
	pwfile="$(mktemp)"
	printf '%s\n' "$PINCER_DB_SUPERPASSWORD" >"$pwfile"
	chown postgres "$pwfile"
	as_pg "$BIN/initdb" -D "$DATA" -U postgres --pwfile="$pwfile" --encoding=UTF8 \
		--locale=C.UTF-8 --auth-host=scram-sha-256 --auth-local=reject >/dev/null ||
		{ rm -f "$pwfile"; die "initdb failed in $DATA"; }
	rm -f "$pwfile"
	# Loopback TCP only; no Unix socket (/run/postgresql may not exist on a fresh machine).
	cat >>"$DATA/postgresql.conf" <<CONF
listen_addresses = '127.0.0.1'
unix_socket_directories = ''
CONF
	if [ -n "${PINCER_PG_THROWAWAY:-}" ]; then
		printf "fsync = off\nsynchronous_commit = off\nfull_page_writes = off\n" >>"$DATA/postgresql.conf"
	fi
}

ensure_app_database() {
	: "${PINCER_DB_PASSWORD:?PINCER_DB_PASSWORD must be set}"
	local pw="${PINCER_DB_PASSWORD//\'/\'\'}"
	if [ "$(superuser_sql -c "select 1 from pg_roles where rolname = 'pincer'")" != "1" ]; then
		superuser_sql -c "create role pincer login password '$pw'"
	fi
	for db in $DB_NAME; do
		if [ "$(superuser_sql -c "select 1 from pg_database where datname = '$db'")" != "1" ]; then
			superuser_sql -c "create database \"$db\" owner pincer"
		fi
	done
}

cmd_start() {
	[ -f "$DATA/PG_VERSION" ] || init_cluster
	if is_running; then
		say "PostgreSQL already running on 127.0.0.1:$PORT ($DATA)"
	else
		port_in_use "$PORT" && die "port $PORT is taken; set PGPORT to a free port"
		as_pg "$BIN/pg_ctl" -D "$DATA" -l "$DATA/server.log" -w -t 30 \
			-o "-p $PORT" start >/dev/null ||
			die "PostgreSQL failed to start; see $DATA/server.log ($(tail -n 1 "$DATA/server.log" 2>/dev/null))"
		say "PostgreSQL running on 127.0.0.1:$PORT ($DATA)"
	fi
	[ -n "${PINCER_DB_PASSWORD:-}" ] && ensure_app_database
	return 0
}

cmd_stop() {
	if is_running; then
		as_pg "$BIN/pg_ctl" -D "$DATA" -m fast -w -t 30 stop >/dev/null
		say "PostgreSQL stopped ($DATA)"
	fi
}

cmd_status() {
	if is_running; then echo "running on 127.0.0.1:$PORT ($DATA)"; else echo "stopped ($DATA)"; exit 3; fi
}

case "${1:-}" in
start) cmd_start ;;
stop) cmd_stop ;;
status) cmd_status ;;
*) die "usage: scripts/db.sh start|stop|status" ;;
esac
