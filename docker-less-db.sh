#!/usr/bin/env bash
# A private PostgreSQL for Crownbench, without Docker.
#
#   ./docker-less-db.sh start [DBNAME...]   install if missing, create the cluster, start it, create databases
#   ./docker-less-db.sh stop                stop the cluster
#   ./docker-less-db.sh status              say whether it runs, and where
#   ./docker-less-db.sh url [DBNAME]        print the connection URL
#
# The cluster lives in .data/pg inside the project (git-ignored) and listens on 127.0.0.1 only.
# Settings: CB_DB_PORT (default 54329), CB_DB_DIR (default <project>/.data/pg),
# CB_DB_NAME (default crownbench). Every subcommand is safe to run again.
set -euo pipefail

here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
port="${CB_DB_PORT:-54329}"
datadir="${CB_DB_DIR:-$here/.data/pg}"
dbname="${CB_DB_NAME:-crownbench}"
logfile="$(dirname "$datadir")/postgres-$port.log"

say() { printf 'db: %s\n' "$*" >&2; }

find_bin() {
	local d
	for d in /usr/lib/postgresql/*/bin; do
		[ -x "$d/initdb" ] && { echo "$d"; return 0; }
	done
	return 1
}

install_postgres() {
	if find_bin >/dev/null; then return 0; fi
	say "PostgreSQL server not found; installing Debian's postgresql package"
	if [ "$(id -u)" -ne 0 ]; then
		say "run as root (or: sudo apt-get install -y postgresql) to install it"
		exit 1
	fi
	export DEBIAN_FRONTEND=noninteractive
	apt-get update -qq >/dev/null
	apt-get install -y -qq postgresql >/dev/null
	find_bin >/dev/null || { say "installation did not provide initdb"; exit 1; }
}

# Run a PostgreSQL program as the cluster's owner: initdb refuses to run as root.
as_owner() {
	if [ "$(id -u)" -eq 0 ]; then
		runuser -u postgres -- "$@"
	else
		"$@"
	fi
}

prepare_dir() {
	mkdir -p "$(dirname "$datadir")"
	if [ "$(id -u)" -eq 0 ]; then
		mkdir -p "$datadir"
		chown postgres:postgres "$datadir"
		chmod 700 "$datadir"
		touch "$logfile"
		chown postgres:postgres "$logfile"
		if ! runuser -u postgres -- test -w "$datadir"; then
			# The project sits where the postgres user cannot reach (a home folder, say):
			# keep the cluster in a private folder elsewhere and link it from the project.
			local alt="/var/tmp/crownbench-pg-$(printf '%s' "$datadir" | md5sum | cut -c1-12)"
			mkdir -p "$alt"
			chown postgres:postgres "$alt"
			chmod 700 "$alt"
			rmdir "$datadir" 2>/dev/null || true
			ln -sfn "$alt" "$datadir"
			logfile="$alt.log"
			touch "$logfile"
			chown postgres:postgres "$logfile"
		fi
	else
		mkdir -p "$datadir"
		chmod 700 "$datadir"
	fi
}

is_running() {
	local bin
	bin="$(find_bin)" || return 1
	[ -f "$datadir/PG_VERSION" ] || return 1
	as_owner "$bin/pg_ctl" -D "$datadir" status >/dev/null 2>&1
}

psql_cmd() {
	local bin
	bin="$(find_bin)"
	as_owner "$bin/psql" -X -q -h 127.0.0.1 -p "$port" -U postgres "$@"
}

create_db() {
	local name="$1"
	if ! [[ "$name" =~ ^[a-z_][a-z0-9_]*$ ]]; then
		say "database name '$name' must be lower-case letters, digits and _"
		exit 1
	fi
	if [ "$(psql_cmd -d postgres -tAc "select 1 from pg_database where datname = '$name'")" != "1" ]; then
		psql_cmd -d postgres -c "create database $name" >/dev/null
		say "created database $name"
	fi
}

start() {
	install_postgres
	local bin
	bin="$(find_bin)"
	prepare_dir
	if [ ! -f "$datadir/PG_VERSION" ]; then
		say "creating a cluster in $datadir"
		as_owner "$bin/initdb" -D "$datadir" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
		cat >>"$datadir/postgresql.conf" <<-CONF
			listen_addresses = '127.0.0.1'
			unix_socket_directories = '.'
			max_connections = 200
			fsync = on
		CONF
	fi
	if is_running; then
		say "already running on 127.0.0.1:$port"
	else
		as_owner "$bin/pg_ctl" -D "$datadir" -l "$logfile" -o "-p $port -k ." -w -t 30 start >/dev/null
		say "started on 127.0.0.1:$port"
	fi
	local names=("$@")
	[ ${#names[@]} -eq 0 ] && names=("$dbname")
	for n in "${names[@]}"; do create_db "$n"; done
}

stop() {
	local bin
	bin="$(find_bin)" || { say "PostgreSQL is not installed"; return 0; }
	if is_running; then
		as_owner "$bin/pg_ctl" -D "$datadir" -m fast -w stop >/dev/null
		say "stopped"
	else
		say "not running"
	fi
}

status() {
	if is_running; then
		say "running on 127.0.0.1:$port, data in $datadir"
		return 0
	fi
	say "not running (start it with ./docker-less-db.sh start)"
	return 3
}

case "${1:-}" in
start) shift; start "$@" ;;
stop) stop ;;
status) status ;;
url) echo "postgres://postgres@127.0.0.1:$port/${2:-$dbname}" ;;
*)
	echo "usage: $0 start [DBNAME...] | stop | status | url [DBNAME]" >&2
	exit 2
	;;
esac
