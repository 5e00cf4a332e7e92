#!/bin/sh
# Container entrypoint sketch (documentation only; see docker/README.md).
# Turns Docker/Kubernetes secret files into the environment variables that
# lib/server/env.ts reads, then runs the service's command.
set -eu

read_secret() { # read_secret NAME -> contents of /run/secrets/NAME, if present
  if [ -r "/run/secrets/$1" ]; then cat "/run/secrets/$1"; fi
}

if [ -z "${DATABASE_URL:-}" ] && [ -n "${DATABASE_HOST:-}" ]; then
  pw="$(read_secret emfolio_db_password)"
  # The password is URL-encoded so any character works.
  pw_enc="$(node -e 'process.stdout.write(encodeURIComponent(process.argv[1]))' "$pw")"
  DATABASE_URL="postgresql://${DATABASE_USER:-emfolio}:${pw_enc}@${DATABASE_HOST}:${DATABASE_PORT:-5432}/${DATABASE_NAME:-emfolio}"
  export DATABASE_URL
fi
: "${NEXTAUTH_SECRET:=$(read_secret emfolio_nextauth_secret)}"
: "${S3_ACCESS_KEY_ID:=$(read_secret emfolio_s3_access_key)}"
: "${S3_SECRET_ACCESS_KEY:=$(read_secret emfolio_s3_secret_key)}"
# Optional: without it the attachments panel says which variable is missing.
: "${UPLOADTHING_TOKEN:=$(read_secret emfolio_uploadthing_token)}"
export NEXTAUTH_SECRET S3_ACCESS_KEY_ID S3_SECRET_ACCESS_KEY UPLOADTHING_TOKEN

exec "$@"
