# Shared helpers for start, test and database scripts. Source it; do not run it.
# shellcheck shell=bash

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

say() { printf '\033[1;33m[pincer]\033[0m %s\n' "$*" >&2; }
die() { printf '\033[1;31m[pincer] %s\033[0m\n' "$*" >&2; exit 1; }

# Newest installed PostgreSQL server binaries (Debian keeps them off PATH).
pg_bindir() {
	local dir
	dir="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)"
	[ -n "$dir" ] && [ -x "$dir/postgres" ] && echo "$dir"
}

apt_install() {
	say "installing Debian packages: $*"
	export DEBIAN_FRONTEND=noninteractive
	if [ -z "${PINCER_APT_UPDATED:-}" ]; then
		apt-get update -qq >/dev/null || die "apt-get update failed"
		PINCER_APT_UPDATED=1
	fi
	apt-get install -y -qq "$@" >/dev/null || die "apt-get install $* failed"
}

ensure_postgres() {
	pg_bindir >/dev/null || apt_install postgresql
	pg_bindir >/dev/null || die "PostgreSQL server binaries not found after install"
	# Debian's package may start its own cluster on 5432; ours never uses it.
}

ensure_chromium() {
	[ -x /usr/bin/chromium ] || apt_install chromium
}

# npm ci when node_modules is missing or older than the lock file.
ensure_node_modules() {
	local marker="$ROOT/node_modules/.package-lock.json"
	if [ ! -f "$marker" ] || [ "$ROOT/package-lock.json" -nt "$marker" ]; then
		say "npm ci"
		(cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error) || die "npm ci failed"
	fi
}

port_in_use() {
	node -e '
		const s = require("net").createServer();
		s.once("error", () => process.exit(0));
		s.listen(+process.argv[1], "127.0.0.1", () => s.close(() => process.exit(1)));
	' "$1"
}

free_port() {
	node -e '
		const s = require("net").createServer();
		s.listen(0, "127.0.0.1", () => { console.log(s.address().port); s.close(); });
	'
}

random_secret() {
	node -e 'console.log(require("crypto").randomBytes(+process.argv[1]).toString("base64url"))' "${1:-32}"
}
