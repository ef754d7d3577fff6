#!/bin/sh
# Creates deploy/mosquitto/passwd for docker-compose: one line per user, hashed by
# mosquitto_passwd. Usage:
#   deploy/mosquitto/make-passwords.sh meniscus-server:SECRET probe-a:SECRET weather-1:SECRET
# MOSQUITTO_PASSWD_FILE=PATH writes elsewhere.
# Needs mosquitto_passwd (Debian package mosquitto, or run inside the eclipse-mosquitto image).
set -eu
dir=$(dirname "$0")
file="${MOSQUITTO_PASSWD_FILE:-$dir/passwd}"
: > "$file"
chmod 600 "$file"
for pair in "$@"; do
  user=${pair%%:*}
  password=${pair#*:}
  if [ -z "$user" ] || [ "$user" = "$pair" ] || [ -z "$password" ]; then
    echo "make-passwords.sh: each argument must be USER:PASSWORD, got '$pair'" >&2
    exit 2
  fi
  mosquitto_passwd -b "$file" "$user" "$password"
done
echo "wrote $file with $# users"
