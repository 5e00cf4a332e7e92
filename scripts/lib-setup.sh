# Shared by scripts/up.sh and scripts/test.sh. Sourced, not run.
export NEXT_TELEMETRY_DISABLED=1
# The AWS SDK warns on every start that releases after January 2027 need Node 22; this project pins one that runs on 20.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

step() { printf '\n\033[1m== %s\033[0m\n' "$*"; }

ensure_node_modules() {
  local stamp="node_modules/.emfolio-lock-sha"
  local want
  want="$(sha256sum package-lock.json | cut -d' ' -f1)"
  if [[ ! -d node_modules || ! -f "$stamp" || "$(cat "$stamp")" != "$want" ]]; then
    step "npm ci"
    npm ci --no-audit --no-fund
    printf '%s' "$want" >"$stamp"
  fi
}

# Writes .env for the demo once, with a fresh random secret. An existing .env is left alone.
ensure_dotenv() {
  if [[ -f .env ]]; then return; fi
  step "writing .env for the local demo"
  {
    echo "# Written by scripts/up.sh for the local demo. See .env.example for every variable."
    bash scripts/services.sh env | grep -vE '^(TEST_|SMTP_URL)'
    echo "NEXTAUTH_URL=http://127.0.0.1:3000"
    echo "NEXTAUTH_SECRET=$(head -c 32 /dev/urandom | base64 | tr -d '\n=+/')"
    echo "QUEUE_PREFIX=emfolio"
  } >.env
}

# Exports the variables of an env file into this shell.
load_env_file() {
  set -a
  # shellcheck disable=SC1090
  source "$1"
  set +a
}
