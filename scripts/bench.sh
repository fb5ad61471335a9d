#!/usr/bin/env bash
# The benchmark (npm run bench): installs what is missing, starts PostgreSQL if it is not running,
# builds the app, starts the SMTP fake, runs scripts/bench/run.ts (which seeds its own database,
# starts the app and the bare baseline on loopback and measures, the convention show and then the
# busy Saturday), prints one JSON document on stdout and stops what it started. Progress goes to
# stderr. Takes about six minutes; CB_BENCH_ONLY=saturday runs the busy Saturday alone.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

ensure_node_modules
db_was_running=1
./docker-less-db.sh status >/dev/null 2>&1 || db_was_running=0
bench_db="${CB_BENCH_DB:-crownbench_bench}"
./docker-less-db.sh start "$bench_db" >&2

export CB_BENCH_DB_URL="$(./docker-less-db.sh url "$bench_db")"
export CB_BENCH_APP_PORT="${CB_BENCH_APP_PORT:-4890}" CB_BENCH_BASELINE_PORT="${CB_BENCH_BASELINE_PORT:-4891}"
export SMTP_FAKE_PORT="${CB_BENCH_SMTP_PORT:-2690}" SMTP_FAKE_HTTP_PORT="${CB_BENCH_SMTP_HTTP_PORT:-2691}"
export SMTP_URL="smtp://127.0.0.1:$SMTP_FAKE_PORT"
export AUTH_SECRET="bench-secret-$(date +%s)-$RANDOM"

finish() {
	stop_background
	# Leave PostgreSQL as we found it.
	if [ "$db_was_running" -eq 0 ]; then ./docker-less-db.sh stop >&2; fi
}
trap finish EXIT INT TERM

echo "bench: building the app" >&2
npx vite build --logLevel error >/dev/null
start_smtp_fake >&2
node --import tsx scripts/bench/run.ts
