#!/usr/bin/env bash
# The whole test suite, from a fresh machine: installs what is missing (npm packages, Debian's
# chromium, PostgreSQL), starts its own database and SMTP fake, and runs format and lint checks,
# type checks, unit tests, integration tests against PostgreSQL and browser tests against the
# built app. Exits non-zero when anything fails.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
set -e

ensure_node_modules
# Type-aware lint reads the generated .svelte-kit/tsconfig.json; a fresh clone has none yet.
npx svelte-kit sync
if ! command -v chromium >/dev/null 2>&1; then
	echo "setup: installing Debian's chromium for the browser tests"
	if [ "$(id -u)" -ne 0 ]; then
		echo "run as root, or install it first: sudo apt-get install -y chromium" >&2
		exit 1
	fi
	export DEBIAN_FRONTEND=noninteractive
	apt-get update -qq >/dev/null
	apt-get install -y -qq chromium >/dev/null
fi

test_db="${CB_TEST_DB:-crownbench_test}"
e2e_db="${CB_E2E_DB:-crownbench_e2e}"
# The fresh-database browser tests: migrations and no demo seed, as a new host starts.
fresh_db="${CB_FRESH_DB:-crownbench_fresh}"
./docker-less-db.sh start "$test_db" "$e2e_db" "$fresh_db"

export SMTP_FAKE_PORT="${TEST_SMTP_PORT:-2535}" SMTP_FAKE_HTTP_PORT="${TEST_SMTP_HTTP_PORT:-2536}"
export SMTP_URL="smtp://127.0.0.1:$SMTP_FAKE_PORT"
export CB_DEV_MAIL_URL="http://127.0.0.1:$SMTP_FAKE_HTTP_PORT"
export AUTH_SECRET="test-secret-$(date +%s)-$RANDOM"
export PAYMENT_FAKE_PORT="${TEST_PAYMENT_PORT:-12112}"
export PAYMENT_FAKE_WEBHOOK_URL="http://127.0.0.1:${TEST_APP_PORT:-4173}/api/payments/webhook"
use_payment_fake
# Browser tests sign the same demo people in many times: a roomier limit per address, and all
# of them come from 127.0.0.1. A test checks that the limit per address still bites.
# Any signed-in person may start a society in the tests (the default, closed, is tested too).
export CB_SOCIETY_SIGNUP=open
export CB_SIGNIN_LIMIT_PER_ADDRESS="${CB_SIGNIN_LIMIT_PER_ADDRESS:-30}" CB_SIGNIN_LIMIT_PER_IP="${CB_SIGNIN_LIMIT_PER_IP:-100000}"
start_smtp_fake
start_payment_fake
trap stop_background EXIT INT TERM
set +e

passed=0
failed=0
failures=()
# CB_TEST_STEPS (for example "unit e2e") runs only those steps while working on something; the
# test command itself (and CI) runs every step. CB_E2E_ARGS goes to playwright (a spec file, --grep).
step() {
	local key="$1" name="$2"
	shift 2
	if [ -n "${CB_TEST_STEPS:-}" ] && [[ " ${CB_TEST_STEPS//,/ } " != *" $key "* ]]; then
		return 0
	fi
	echo
	echo "=== $name"
	local started=$SECONDS
	if "$@"; then
		passed=$((passed + 1))
		echo "=== $name: passed ($((SECONDS - started)) s)"
	else
		failed=$((failed + 1))
		failures+=("$name")
		echo "=== $name: FAILED ($((SECONDS - started)) s)"
	fi
}

e2e() {
	local port="${TEST_APP_PORT:-4173}" fresh_port="${TEST_FRESH_APP_PORT:-4174}"
	local fresh_url
	fresh_url="$(./docker-less-db.sh url "$fresh_db")"
	export DATABASE_URL
	DATABASE_URL="$(./docker-less-db.sh url "$e2e_db")"
	npx tsx scripts/db.ts reset || return 1
	DATABASE_URL="$fresh_url" npx tsx scripts/db.ts empty || return 1
	PORT="$port" HOST=127.0.0.1 ORIGIN="http://127.0.0.1:$port" BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-12M}" \
		node build >.data/e2e-app.log 2>&1 &
	local app=$!
	background_pids+=("$app")
	# A second built app, same settings, on the database with no seed (tests/e2e/new-society.spec.ts).
	DATABASE_URL="$fresh_url" PORT="$fresh_port" HOST=127.0.0.1 ORIGIN="http://127.0.0.1:$fresh_port" \
		BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-12M}" node build >.data/e2e-fresh-app.log 2>&1 &
	local fresh=$!
	background_pids+=("$fresh")
	wait_for_url "http://127.0.0.1:$port/" 30 || { cat .data/e2e-app.log; return 1; }
	wait_for_url "http://127.0.0.1:$fresh_port/" 30 || { cat .data/e2e-fresh-app.log; return 1; }
	E2E_BASE_URL="http://127.0.0.1:$port" FRESH_BASE_URL="http://127.0.0.1:$fresh_port" \
		npx playwright test ${CB_E2E_ARGS:-}
	local rc=$?
	stop_pid "$app"
	stop_pid "$fresh"
	if [ $rc -ne 0 ]; then
		echo "--- app log"
		tail -50 .data/e2e-app.log
		echo "--- fresh app log"
		tail -50 .data/e2e-fresh-app.log
	fi
	return $rc
}

step format "format (prettier)" npx prettier --check .
step lint "lint (eslint)" npx eslint . --max-warnings 0
step types "types (svelte-check)" npm run --silent check
step unit "unit tests (vitest)" npx vitest run
step integration "integration tests (vitest + PostgreSQL)" env DATABASE_URL="$(./docker-less-db.sh url "$test_db")" \
	npx vitest run --config vitest.integration.config.ts
step build "build (vite)" npx vite build --logLevel warn
# Faults (tests/faults): the built app against a private PostgreSQL cluster that the tests stop and
# restart (never the one above), with an SMTP fake of their own that they stop.
step faults "fault tests (built app, database restart, SMTP down, killed publish)" \
	npx vitest run --config tests/faults/vitest.config.ts
# Two instances (tests/instances): two built apps and two job workers on one PostgreSQL cluster of
# their own (sessions, sign-in limits, placements e-mails once, the board alike).
step instances "two instances (two apps, two workers, one database)" \
	npx vitest run --config tests/instances/vitest.config.ts
step e2e "browser tests (playwright + chromium)" e2e

echo
if [ $failed -gt 0 ]; then
	echo "failed steps: ${failures[*]}"
fi
echo "steps: $passed passed, $failed failed"
[ $failed -eq 0 ]
