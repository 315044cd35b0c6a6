# Starts every local fake under fakes/<name>/server.ts in the background; stop_fakes ends them.
# shellcheck shell=bash

FAKE_PIDS=()

start_fakes() {
	local server name
	for server in "$ROOT"/fakes/*/server.ts; do
		[ -f "$server" ] || continue
		name="$(basename "$(dirname "$server")")"
		"$ROOT/node_modules/.bin/tsx" "$server" >"${PINCER_LOG_DIR:-$ROOT/.data}/fake-$name.log" 2>&1 &
		FAKE_PIDS+=("$!")
	done
	for server in "$ROOT"/fakes/*/server.ts; do
		[ -f "$server" ] || continue
		name="$(basename "$(dirname "$server")")"
		wait_for_log "${PINCER_LOG_DIR:-$ROOT/.data}/fake-$name.log" "ready" 20 ||
			die "the local $name fake did not start; see ${PINCER_LOG_DIR:-$ROOT/.data}/fake-$name.log"
	done
}

stop_fakes() {
	local pid
	for pid in "${FAKE_PIDS[@]}"; do kill -TERM "$pid" 2>/dev/null || true; done
	for pid in "${FAKE_PIDS[@]}"; do wait "$pid" 2>/dev/null || true; done
	FAKE_PIDS=()
}

wait_for_log() {
	local file="$1" word="$2" seconds="$3" i
	for ((i = 0; i < seconds * 10; i++)); do
		grep -q "$word" "$file" 2>/dev/null && return 0
		sleep 0.1
	done
	return 1
}
