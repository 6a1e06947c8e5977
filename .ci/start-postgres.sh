#!/usr/bin/env bash
# Starts a throwaway PostgreSQL server on loopback for the second integration run, and prints
# its URL. Uses Debian's packages; the server runs as the postgres user (it refuses root).
set -euo pipefail
port="${1:-55432}"
bindir="$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)"
data="$(mktemp -d /tmp/plateroom-pg.XXXXXX)"
chown postgres:postgres "$data"
runuser -u postgres -- "$bindir/initdb" -D "$data" -U postgres --auth=trust -E UTF8 >/dev/null
runuser -u postgres -- "$bindir/pg_ctl" -D "$data" -o "-c listen_addresses=127.0.0.1 -p $port -k $data -c fsync=off" -l "$data/server.log" -w start >/dev/null
echo "postgres://postgres@127.0.0.1:$port/postgres"
