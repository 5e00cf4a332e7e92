#!/bin/sh
# Container entrypoint (docker/Dockerfile): turns Docker/Kubernetes secret files into the
# environment variables that lib/server/env.ts reads, then runs the service's command.
# tests/unit/scripts/docker-consistency.test.ts reads the `from_secret` lines and the two URL
# builders below to check that compose gives web and worker every required variable.
set -eu

read_secret() { # read_secret NAME -> contents of /run/secrets/NAME, if present
  if [ -r "/run/secrets/$1" ]; then cat "/run/secrets/$1"; fi
}
url_encode() { node -e 'process.stdout.write(encodeURIComponent(process.argv[1]))' "$1"; }
# from_secret VARIABLE SECRET: VARIABLE from the secret file, unless it is set already.
from_secret() {
  if [ -z "$(printenv "$1" || true)" ]; then
    value="$(read_secret "$2")"
    if [ -n "$value" ]; then export "$1=$value"; fi
  fi
}

# DATABASE_URL from DATABASE_HOST and the secret emfolio_db_password (URL-encoded, any character works).
if [ -z "${DATABASE_URL:-}" ] && [ -n "${DATABASE_HOST:-}" ]; then
  DATABASE_URL="postgresql://${DATABASE_USER:-emfolio}:$(url_encode "$(read_secret emfolio_db_password)")@${DATABASE_HOST}:${DATABASE_PORT:-5432}/${DATABASE_NAME:-emfolio}"
  export DATABASE_URL
fi
# REDIS_URL from REDIS_HOST and the secret emfolio_redis_password (Redis runs with requirepass).
if [ -z "${REDIS_URL:-}" ] && [ -n "${REDIS_HOST:-}" ]; then
  REDIS_URL="redis://:$(url_encode "$(read_secret emfolio_redis_password)")@${REDIS_HOST}:${REDIS_PORT:-6379}/${REDIS_DB:-0}"
  export REDIS_URL
fi
from_secret NEXTAUTH_SECRET emfolio_nextauth_secret
from_secret S3_ACCESS_KEY_ID emfolio_s3_access_key
from_secret S3_SECRET_ACCESS_KEY emfolio_s3_secret_key
from_secret SMTP_PASSWORD emfolio_smtp_password
# Optional: without it the attachments panel says which variable is missing.
from_secret UPLOADTHING_TOKEN emfolio_uploadthing_token

exec "$@"
