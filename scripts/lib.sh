# Shared pieces of the demo and test scripts (sourced, not run).

background_pids=()

# npm ci when node_modules is missing or older than the lock file.
ensure_node_modules() {
	if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
		echo "setup: installing npm packages"
		npm ci --no-audit --no-fund
	fi
}

# A random secret for Auth.js, kept in .data so sessions survive a restart of the demo.
auth_secret() {
	mkdir -p .data
	[ -s .data/auth-secret ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' >.data/auth-secret
	cat .data/auth-secret
}

# Waits until a URL answers, or fails after $2 seconds.
wait_for_url() {
	local url="$1" limit="${2:-30}" i
	for ((i = 0; i < limit * 5; i++)); do
		curl -s -o /dev/null "$url" && return 0
		sleep 0.2
	done
	echo "no answer from $url after $limit s" >&2
	return 1
}

start_smtp_fake() {
	mkdir -p .data
	node scripts/smtp-fake.js >".data/smtp-fake-$SMTP_FAKE_PORT.log" 2>&1 &
	background_pids+=($!)
	wait_for_url "http://127.0.0.1:$SMTP_FAKE_HTTP_PORT/health" 15
}

# The local payment fake (scripts/payment-fake.js) on PAYMENT_FAKE_PORT; it signs webhooks with
# STRIPE_WEBHOOK_SECRET and posts them to PAYMENT_FAKE_WEBHOOK_URL.
start_payment_fake() {
	mkdir -p .data
	node scripts/payment-fake.js >".data/payment-fake-$PAYMENT_FAKE_PORT.log" 2>&1 &
	background_pids+=($!)
	wait_for_url "http://127.0.0.1:$PAYMENT_FAKE_PORT/health" 15
}

# Points the app's payment SDK at the local fake (exports the STRIPE_* settings).
use_payment_fake() {
	# The fake is a development setting: a production build run by the tests opts in to it.
	export CB_ALLOW_FAKES=1
	export STRIPE_SECRET_KEY="sk_test_crownbench_local_fake"
	export STRIPE_WEBHOOK_SECRET="whsec_crownbench_local_fake_$RANDOM$RANDOM"
	export STRIPE_API_HOST=127.0.0.1 STRIPE_API_PORT="$PAYMENT_FAKE_PORT" STRIPE_API_PROTOCOL=http
}

# Stops a process: SIGTERM, then SIGKILL if it has not ended within 10 s.
stop_pid() {
	local pid="$1" i
	kill "$pid" 2>/dev/null || return 0
	for ((i = 0; i < 50; i++)); do
		kill -0 "$pid" 2>/dev/null || break
		sleep 0.2
	done
	kill -9 "$pid" 2>/dev/null || true
	wait "$pid" 2>/dev/null || true
}

stop_background() {
	local pid
	for pid in "${background_pids[@]}"; do stop_pid "$pid"; done
	background_pids=()
}
