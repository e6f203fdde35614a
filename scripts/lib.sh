# Shared steps of the two README commands (sourced, not run).

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"

say() { printf '\033[1m[loomwright]\033[0m %s\n' "$*" >&2; }

apt_ready=
apt_install() {
	if [ "$(id -u)" -ne 0 ]; then say "need root to apt-get install $*"; return 1; fi
	if [ -z "$apt_ready" ]; then DEBIAN_FRONTEND=noninteractive apt-get update -qq; apt_ready=1; fi
	DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

need_node() {
	local major
	major=$(node -p 'process.versions.node.split(".")[0]' 2>/dev/null || echo 0)
	if [ "$major" -lt 20 ]; then say "Node.js 20 or newer is needed (found: $(node --version 2>/dev/null || echo none))"; exit 1; fi
}

# npm ci when node_modules is missing or older than the lock file.
install_packages() {
	need_node
	if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
		say "installing packages (npm ci)"
		npm ci --no-audit --no-fund --loglevel=error
	fi
}

# Starts the mail and storage fakes in the background; waits until they answer.
start_fakes() {
	local log=$1
	node --import tsx scripts/fakes.ts >"$log" 2>&1 &
	fakes_pid=$!
	for _ in $(seq 1 100); do
		if grep -q '^\[fakes\]' "$log" 2>/dev/null; then return 0; fi
		if ! kill -0 "$fakes_pid" 2>/dev/null; then say "mail/storage fakes failed:"; cat "$log" >&2; return 1; fi
		sleep 0.1
	done
	say "mail/storage fakes did not start"; cat "$log" >&2; return 1
}
