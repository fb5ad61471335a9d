#!/usr/bin/env bash
# npm run backup [FILE]       dump the database (DATABASE_URL, or the local one) to FILE,
#                             by default .data/backups/crownbench-<date>.dump (pg_dump custom format)
# npm run restore -- FILE [--yes]
#                             replace the database's contents with FILE; asks first unless --yes
set -euo pipefail
cd "$(dirname "$0")/.."

url="${DATABASE_URL:-$(./docker-less-db.sh url)}"
bin=""
for d in /usr/lib/postgresql/*/bin; do [ -x "$d/pg_dump" ] && bin="$d"; done
[ -n "$bin" ] || { echo "pg_dump not found: run ./docker-less-db.sh start once to install PostgreSQL" >&2; exit 1; }

case "${1:-}" in
backup)
	file="${2:-.data/backups/crownbench-$(date -u +%Y%m%d-%H%M%S).dump}"
	mkdir -p "$(dirname "$file")"
	"$bin/pg_dump" --format=custom --no-owner --no-privileges --file="$file" "$url"
	echo "backup written to $file ($(du -h "$file" | cut -f1))"
	;;
restore)
	file="${2:-}"
	[ -n "$file" ] && [ -f "$file" ] || { echo "usage: npm run restore -- FILE [--yes]" >&2; exit 2; }
	if [ "${3:-}" != "--yes" ]; then
		read -r -p "This replaces everything in ${url##*/} with $file. Type yes to go on: " answer
		[ "$answer" = "yes" ] || { echo "nothing changed"; exit 1; }
	fi
	"$bin/psql" -X -q -v ON_ERROR_STOP=1 "$url" -c 'DROP SCHEMA public CASCADE; CREATE SCHEMA public;' >/dev/null
	"$bin/pg_restore" --no-owner --no-privileges --exit-on-error --dbname="$url" "$file"
	echo "restored ${url##*/} from $file"
	;;
*)
	echo "usage: scripts/backup.sh backup [FILE] | restore FILE [--yes]" >&2
	exit 2
	;;
esac
