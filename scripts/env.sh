# Shared defaults for scripts/start.sh and scripts/test.sh (sourced, not run).
export PGPORT="${PGPORT:-54329}"
export HOST="${HOST:-127.0.0.1}"
export PORT="${PORT:-4321}"
export SMTP_PORT="${SMTP_PORT:-2525}"
export ASTRO_TELEMETRY_DISABLED=1
mkdir -p .data
# The auth secret: from the environment in production, else made once per checkout.
if [ -z "${BETTER_AUTH_SECRET:-}" ]; then
  [ -s .data/auth-secret ] || node -e "process.stdout.write(require('crypto').randomBytes(32).toString('base64url'))" > .data/auth-secret
  BETTER_AUTH_SECRET="$(cat .data/auth-secret)"
  export BETTER_AUTH_SECRET
fi

# Refuse early, with a fix, when a port we need is taken.
port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
require_port() {
  port_free "$1" || { echo "setup: port $1 on 127.0.0.1 is already in use ($2). Stop what uses it or set $3=<another port>." >&2; exit 1; }
}

# Rebuild only when a source file is newer than the last build.
build_if_stale() {
  if [ -f "${SWARDKEEP_DIST:-dist}/.build-stamp" ] && [ -z "$(find src public astro.config.mjs package-lock.json -newer "${SWARDKEEP_DIST:-dist}/.build-stamp" -print -quit)" ]; then
    return 0
  fi
  echo "setup: building the app"
  npx astro build --silent
  node scripts/build-worker.mjs "${SWARDKEEP_DIST:-dist}"
  node scripts/precompress.mjs "${SWARDKEEP_DIST:-dist}/client"
  touch "${SWARDKEEP_DIST:-dist}/.build-stamp"
}

wait_http() { # url pid
  for _ in $(seq 1 150); do
    node -e "fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))" "$1" && return 0
    kill -0 "$2" 2>/dev/null || return 1
    sleep 0.2
  done
  return 1
}
