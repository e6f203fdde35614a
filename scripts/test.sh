#!/usr/bin/env bash
# README command 2: every test. Installs what the tests need (packages, PostgreSQL, Debian's
# chromium and ngspice), gives the tests fresh databases of their own on a separate loopback
# cluster, starts the mail and storage fakes, then runs: type check, unit, build, integration,
# end-to-end; and ends with a summary.
set -uo pipefail
source "$(dirname "$0")/lib.sh"

started=$(date +%s)
out=.data/test
rm -rf "$out" && mkdir -p "$out"

install_packages || exit 1
command -v chromium >/dev/null || { say "installing Debian's chromium"; apt_install chromium || exit 1; }
command -v ngspice >/dev/null || { say "installing ngspice (the SPICE oracle)"; apt_install ngspice || exit 1; }

# A cluster of its own for tests (durability off), never the demo's data. What this run starts
# (the cluster, the fakes) it stops when it ends, also when interrupted, so a second checkout's
# run can bind the same ports.
export LOOM_PG_DATA=$root/.data/pg-test LOOM_PG_PORT=${LOOM_TEST_PG_PORT:-54330} LOOM_PG_FAST=1
fakes_pid=
stop_cluster=0
cleanup() {
	[ -n "$fakes_pid" ] && kill "$fakes_pid" 2>/dev/null
	[ "$stop_cluster" = 1 ] && bash scripts/db.sh stop
	return 0
}
trap cleanup EXIT
trap 'exit 130' INT TERM
if [ -n "${DATABASE_URL:-}" ]; then
	say "DATABASE_URL is set: integration tests use it, e2e uses E2E_DATABASE_URL"
	: "${E2E_DATABASE_URL:?set E2E_DATABASE_URL too when DATABASE_URL is set}"
else
	bash scripts/db.sh status || stop_cluster=1
	DATABASE_URL=$(bash scripts/db.sh fresh loomwright_test) || exit 1
	E2E_DATABASE_URL=$(bash scripts/db.sh fresh loomwright_e2e) || exit 1
fi
export DATABASE_URL E2E_DATABASE_URL

# Ports of the mail and storage fakes; override them to run beside another checkout's tests.
export SMTP_PORT=${LOOM_TEST_SMTP_PORT:-2625} MAIL_API_PORT=${LOOM_TEST_MAIL_API_PORT:-2626}
export S3_ENDPOINT=http://127.0.0.1:${LOOM_TEST_S3_PORT:-4669} S3_DIR=$root/.data/test/s3
start_fakes "$out/fakes.log" || exit 1

declare -a names=() results=()
step() {
	local name=$1; shift
	local t0=$(date +%s)
	say "── $name"
	if "$@"; then results+=("pass"); else results+=("FAIL"); fi
	names+=("$name ($(($(date +%s) - t0)) s)")
}

step "type check (svelte-check)" npm run --silent check
step "unit tests" npx vitest run --project unit --reporter=default --reporter=json --outputFile.json="$out/unit.json"
step "build" npm run --silent build
step "integration tests" npx vitest run --project integration --reporter=default --reporter=json --outputFile.json="$out/integration.json"
step "end-to-end tests (chromium)" env PLAYWRIGHT_JSON_OUTPUT_NAME="$out/e2e.json" npx playwright test --reporter=list,json

echo
say "summary ($(($(date +%s) - started)) s)"
failed=0
for i in "${!names[@]}"; do
	printf '  %-4s %s\n' "${results[$i]}" "${names[$i]}"
	[ "${results[$i]}" = pass ] || failed=1
done
# Test counts from the runners' JSON reports, and the failed tests by name, so the last lines
# of a long run say what broke.
node -e '
const fs = require("fs");
let passed = 0, failed = 0;
const names = [];
for (const f of ["unit", "integration"]) {
	try {
		const r = JSON.parse(fs.readFileSync(process.argv[1] + "/" + f + ".json", "utf8"));
		passed += r.numPassedTests; failed += r.numFailedTests;
		for (const file of r.testResults) for (const t of file.assertionResults)
			if (t.status === "failed") names.push(`${f}: ${file.name.replace(process.cwd() + "/", "")} › ${t.fullName}: ${(t.failureMessages[0] ?? "").split("\n")[0].slice(0, 300)}`);
	} catch { failed += 1; names.push(`${f}: no report`); }
}
try {
	const r = JSON.parse(fs.readFileSync(process.argv[1] + "/e2e.json", "utf8"));
	passed += r.stats.expected + r.stats.flaky; failed += r.stats.unexpected;
	const walk = (suite, path) => {
		for (const spec of suite.specs ?? []) for (const t of spec.tests) if (t.status === "unexpected")
			names.push(`e2e: ${spec.file} › ${[...path, spec.title].join(" › ")}: ${(t.results.at(-1)?.error?.message ?? "").split("\n")[0].slice(0, 300)}`);
		for (const s of suite.suites ?? []) walk(s, suite.title && !suite.title.endsWith(".ts") ? [...path, suite.title] : path);
	};
	for (const s of r.suites) walk(s, []);
} catch { failed += 1; names.push("e2e: no report"); }
for (const n of names) console.log("  failed: " + n.replace(/\x1b\[[0-9;]*m/g, ""));
console.log(`${passed} passed, ${failed} failed`);
' "$out"
exit $failed
