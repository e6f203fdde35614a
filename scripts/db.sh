#!/usr/bin/env bash
# PostgreSQL on loopback for Loomwright, in the project's own data folder.
#
#   scripts/db.sh start          start (or reuse) the cluster; make sure the app database exists
#   scripts/db.sh fresh NAME     start the cluster, then drop and create database NAME
#   scripts/db.sh stop           stop the cluster
#   scripts/db.sh url [NAME]     print the connection URL
#
# Both README commands use it. Debian's server binaries are found in /usr/lib/postgresql/*/bin
# and installed with apt-get when missing. initdb and postgres refuse to run as root, so as root
# the server runs as an unprivileged user. Idempotent: a second start reuses the cluster, and a
# pid file left by a killed server is cleared. With DATABASE_URL set, nothing is started.
set -euo pipefail

root=$(cd "$(dirname "$0")/.." && pwd)
port=${LOOM_PG_PORT:-54329}
db_user=loomwright
app_db=${LOOM_PG_DB:-loomwright}
data=${LOOM_PG_DATA:-$root/.data/pg}

log() { echo "[db] $*" >&2; }

find_bin() {
	local d
	d=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
	if [ -n "$d" ] && [ -x "$d/initdb" ]; then echo "$d"; fi
}

ensure_binaries() {
	bin=$(find_bin)
	if [ -z "$bin" ]; then
		log "PostgreSQL server not found; installing Debian's postgresql package"
		if [ "$(id -u)" -ne 0 ]; then
			log "need root to apt-get install postgresql (or set DATABASE_URL to a server)"
			exit 1
		fi
		DEBIAN_FRONTEND=noninteractive apt-get update -qq
		DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null
		bin=$(find_bin)
		[ -n "$bin" ] || { log "postgresql installed but no server binaries found"; exit 1; }
	fi
}

# As root, run server binaries as an unprivileged account.
setup_runner() {
	if [ "$(id -u)" -eq 0 ]; then
		if id postgres >/dev/null 2>&1; then
			run_as=postgres
		else
			id loomwright-db >/dev/null 2>&1 || useradd --system --no-create-home --shell /usr/sbin/nologin loomwright-db
			run_as=loomwright-db
		fi
	else
		run_as=
	fi
}

as_server() {
	if [ -n "$run_as" ]; then
		(cd /tmp && runuser -u "$run_as" -- "$@")
	else
		(cd /tmp && "$@")
	fi
}

# The server account must reach the data folder. A clone under a private (0700) folder is not
# reachable by it, so then the cluster lives under /var/tmp and .data/pg links to it.
place_data() {
	if [ -n "$run_as" ]; then
		mkdir -p "$(dirname "$data")"
		if [ ! -L "$data" ] && ! runuser -u "$run_as" -- test -x "$(dirname "$data")"; then
			local hash real
			hash=$(printf '%s' "$data" | sha1sum | cut -c1-12)
			real=/var/tmp/loomwright-pg-$hash
			mkdir -p "$real"
			rm -rf "$data"
			ln -s "$real" "$data"
			log "project folder is private; cluster kept in $real (linked from $data)"
		fi
		data=$(readlink -f "$data")
	fi
	mkdir -p "$data"
	if [ -n "$run_as" ]; then chown "$run_as" "$data"; fi
	chmod 700 "$data"
}

init_cluster() {
	if [ ! -f "$data/PG_VERSION" ]; then
		log "creating cluster in $data"
		as_server "$bin/initdb" -D "$data" -U "$db_user" --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
		cat >>"$data/postgresql.conf" <<CONF

# Loomwright: loopback only, socket in the data folder.
listen_addresses = '127.0.0.1'
port = $port
unix_socket_directories = '$data'
max_connections = 200
CONF
		if [ "${LOOM_PG_FAST:-}" = 1 ]; then
			# Test clusters only: durability is not needed for throwaway data.
			printf "fsync = off\nsynchronous_commit = off\nfull_page_writes = off\n" >>"$data/postgresql.conf"
		fi
	fi
}

start_cluster() {
	if as_server "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1; then
		return
	fi
	if [ -f "$data/postmaster.pid" ]; then
		log "clearing a stale pid file"
		rm -f "$data/postmaster.pid"
	fi
	as_server "$bin/pg_ctl" -D "$data" -l "$data/server.log" -o "-p $port" -w -t 60 start >/dev/null ||
		{ log "server did not start; see $data/server.log"; tail -n 20 "$data/server.log" >&2; exit 1; }
	log "server on 127.0.0.1:$port"
}

psql_admin() {
	PGOPTIONS="-c client_min_messages=warning" "$bin/psql" -h 127.0.0.1 -p "$port" -U "$db_user" -d postgres -v ON_ERROR_STOP=1 -qtA "$@"
}

ensure_db() {
	local name=$1
	if [ "$(psql_admin -c "select 1 from pg_database where datname = '$name'")" != 1 ]; then
		psql_admin -c "create database \"$name\"" >/dev/null
		log "created database $name"
	fi
}

url() { echo "postgres://$db_user@127.0.0.1:$port/${1:-$app_db}"; }

up() {
	ensure_binaries
	setup_runner
	place_data
	init_cluster
	start_cluster
}

# The installed binaries and an existing cluster folder, without installing or creating anything.
found_cluster() {
	bin=$(find_bin)
	[ -n "$bin" ] || return 1
	setup_runner
	[ -L "$data" ] && data=$(readlink -f "$data")
	[ -d "$data" ]
}

cmd=${1:-start}
case "$cmd" in
start)
	if [ -n "${DATABASE_URL:-}" ]; then log "DATABASE_URL is set; using that server"; exit 0; fi
	up
	ensure_db "$app_db"
	url "$app_db"
	;;
fresh)
	name=${2:?database name}
	up
	psql_admin -c "drop database if exists \"$name\" with (force)" >/dev/null
	psql_admin -c "create database \"$name\"" >/dev/null
	url "$name"
	;;
stop)
	found_cluster || exit 0
	as_server "$bin/pg_ctl" -D "$data" -m fast stop >/dev/null 2>&1 || true
	;;
status)
	# Exit 0 when the cluster is running.
	found_cluster || exit 1
	as_server "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1
	;;
url)
	url "${2:-$app_db}"
	;;
*)
	echo "usage: scripts/db.sh start|fresh NAME|stop|status|url [NAME]" >&2
	exit 2
	;;
esac
