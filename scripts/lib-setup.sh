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

# Writes .env for the demo once, with a fresh random secret. An existing .env is left alone,
# except that one written before attachments existed gets the uploadthing settings appended.
ensure_dotenv() {
  if [[ -f .env ]]; then
    if ! grep -q '^UPLOADTHING_TOKEN=' .env; then
      step "adding the uploadthing settings (attachments) to .env"
      { echo "# Attachments: the local uploadthing fake (scripts/services.sh)."; bash scripts/services.sh env | grep -E '^UPLOADTHING_'; } >>.env
    fi
    # The local store checks signatures and the mail fake requires its password (secrets under .data/).
    if grep -q '^S3_SECRET_ACCESS_KEY=S3RVER$' .env; then
      step "setting the local object store's secret in .env"
      sed -i "s/^S3_SECRET_ACCESS_KEY=S3RVER$/S3_SECRET_ACCESS_KEY=$(bash scripts/services.sh env | sed -n 's/^S3_SECRET_ACCESS_KEY=//p')/" .env
    fi
    if ! grep -q '^SMTP_PASSWORD=' .env; then
      step "adding the mail fake's credentials to .env"
      bash scripts/services.sh env | grep -E '^SMTP_(USER|PASSWORD)=' >>.env
    fi
    return
  fi
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

# Settings for the test database, Redis db 1, bucket emfolio-test and uploadthing app emfolio-test:
# write_test_env PORT QUEUE_PREFIX FILE
write_test_env() {
  {
    bash scripts/services.sh env | sed -nE 's/^TEST_(DATABASE_URL|REDIS_URL)=/\1=/p; s/^TEST_S3_BUCKET=/S3_BUCKET=/p'
    bash scripts/services.sh env | grep -E '^(S3_ENDPOINT|S3_REGION|S3_ACCESS_KEY_ID|S3_SECRET_ACCESS_KEY|S3_FORCE_PATH_STYLE|SMTP_HOST|SMTP_PORT|SMTP_USER|SMTP_PASSWORD|UPLOADTHING_(INGEST_URL|API_URL|UFS_HOST|UFS_APP_ID_LOCATION))='
    bash scripts/services.sh env | sed -nE 's/^TEST_UPLOADTHING_TOKEN=/UPLOADTHING_TOKEN=/p'
    echo "MAIL_DIR=.data/mail"
    echo "QUEUE_PREFIX=$2"
    echo "NEXTAUTH_URL=http://127.0.0.1:$1"
    echo "NEXTAUTH_SECRET=test-secret-not-for-production-0123456789abcdef"
    echo "SIGN_IN_MAX_ATTEMPTS=8"
  } >"$3"
}

# Waits up to 60 s for the web app at BASE_URL to answer its sign-in page.
wait_for_web() {
  for _ in $(seq 1 60); do
    curl -fsS -o /dev/null "$1/sign-in" 2>/dev/null && return 0
    sleep 1
  done
  echo "the web app at $1 did not answer within 60 s (see .data/log/)" >&2
  return 1
}

# start_services_tracked: starts every local service and sets SERVICES_STARTED_HERE to those that
# were not already running, so the caller can stop just those (stop_services_started_here).
SERVICE_NAMES=(postgres redis s3 smtp uploadthing)
SERVICES_STARTED_HERE=()
start_services_tracked() {
  local already_up=() name
  for name in "${SERVICE_NAMES[@]}"; do
    if bash scripts/services.sh status "$name" >/dev/null 2>&1; then already_up+=("$name"); fi
  done
  bash scripts/services.sh start "$@"
  SERVICES_STARTED_HERE=()
  for name in "${SERVICE_NAMES[@]}"; do
    [[ " ${already_up[*]} " == *" $name "* ]] || SERVICES_STARTED_HERE+=("$name")
  done
}

stop_services_started_here() {
  if ((${#SERVICES_STARTED_HERE[@]} > 0)); then bash scripts/services.sh stop "${SERVICES_STARTED_HERE[@]}" >/dev/null 2>&1 || true; fi
}

# ensure_port_free PORT WHAT: stops with a message when something already listens on 127.0.0.1:PORT
# (else the checks that follow would talk to that other server, e.g. an app from another checkout).
ensure_port_free() {
  if (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; then
    echo "port $1 is already in use, so $2 cannot start there: stop that program (an earlier run? 'ss -ltnp | grep :$1' names it) or choose another port" >&2
    return 1
  fi
}
