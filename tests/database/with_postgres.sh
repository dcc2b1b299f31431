#!/usr/bin/env bash
# Runs a test program against a real, throwaway PostgreSQL 15 server (Debian postgresql-15):
# initdb in a temporary folder as an unprivileged user, listening on a Unix socket in that folder
# and on 127.0.0.1 only, the open datasets of tests/reference/data loaded by psql's \copy, and
# the server stopped and its folder removed when the program ends, pass or fail.
#
#   tests/database/with_postgres.sh PROGRAM [ARGS...]
#
# The program finds the server through CALIVERA_PG_* variables (tests/database/postgres_env.h).
# Exit status: the program's; 77 (ctest: skipped) with the reason when no server can be started
# here (no server binaries, no unprivileged user to run it as, initdb or start failing), or 1
# when CALIVERA_REQUIRE_POSTGRES=1 (set by .ci/run) says the server must run.
set -uo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
root="$(cd "$here/../.." && pwd)"
pgbin=/usr/lib/postgresql/15/bin
skip() {
  # This project's CI machines can run a server, so there a skip is a failure.
  if [ "${CALIVERA_REQUIRE_POSTGRES:-0}" = 1 ]; then
    echo "FAILED (CALIVERA_REQUIRE_POSTGRES=1): $*" >&2
    exit 1
  fi
  echo "SKIPPED: $*" >&2
  exit 77
}
[ $# -ge 1 ] || { echo "usage: $0 PROGRAM [ARGS...]" >&2; exit 2; }
[ -x "$pgbin/initdb" ] && [ -x "$pgbin/pg_ctl" ] || skip "no PostgreSQL 15 server here ($pgbin)"
command -v psql >/dev/null || skip "no psql here (postgresql-client-15)"

# Under /tmp, which every user can enter (the build tree may not be), and short enough for a
# socket path.
dir="$(mktemp -d /tmp/calivera_pg.XXXXXX)" || skip "cannot make a temporary folder"
chmod 755 "$dir"
as_server=()
if [ "$(id -u)" -eq 0 ]; then
  # PostgreSQL refuses to run as root; the server runs as the system's unprivileged 'nobody'.
  id nobody >/dev/null 2>&1 || skip "running as root and there is no user 'nobody' to run the server as"
  command -v runuser >/dev/null || skip "running as root and runuser is missing"
  chown nobody "$dir"
  as_server=(runuser -u nobody --)
  # The server's user must be able to reach the folder.
  parent="$(dirname "$dir")"
  runuser -u nobody -- test -x "$parent" || skip "'nobody' cannot enter $parent"
fi
stop_server() {
  if [ -f "$dir/data/postmaster.pid" ]; then
    "${as_server[@]}" "$pgbin/pg_ctl" -D "$dir/data" -m immediate -w stop >/dev/null 2>&1
  fi
  rm -rf "$dir"
}
trap stop_server EXIT
trap 'exit 130' INT TERM

"${as_server[@]}" "$pgbin/initdb" -D "$dir/data" -U calivera_admin -E UTF8 --locale=C \
  --auth-local=trust --auth-host=scram-sha-256 >"$dir/initdb.log" 2>&1 ||
  skip "initdb failed: $(tail -n 3 "$dir/initdb.log" | tr '\n' ' ')"
started=""
for attempt in 1 2 3 4 5; do
  port=$((20000 + (RANDOM % 20000)))
  if "${as_server[@]}" "$pgbin/pg_ctl" -D "$dir/data" -l "$dir/data/server.log" -w -t 60 \
    -o "-c listen_addresses=127.0.0.1 -c port=$port -c unix_socket_directories=$dir -c fsync=off -c max_connections=20" \
    start >/dev/null 2>&1; then
    started=yes
    break
  fi
done
[ -n "$started" ] || skip "the server did not start: $(tail -n 3 "$dir/data/server.log" 2>/dev/null | tr '\n' ' ')"

export CALIVERA_PG_SOCKET_DIR="$dir"
export CALIVERA_PG_PORT="$port"
# The administrator over the socket (trust); tests use it to load, inspect and interrupt.
export CALIVERA_PG_ADMIN_URI="postgresql://calivera_admin@/calivera_test?host=$dir&port=$port"
# A reader role with a password over TCP: the password comes from a password file only.
export CALIVERA_PG_READER_URI="postgresql://calivera_reader@127.0.0.1:$port/calivera_test"
reader_password="reader-$RANDOM$RANDOM"
export CALIVERA_PG_PASSFILE="$dir/pgpass"
printf '127.0.0.1:%s:calivera_test:calivera_reader:%s\n' "$port" "$reader_password" >"$dir/pgpass"
chmod 600 "$dir/pgpass"

data="$root/tests/reference/data"
psql -X -q -v ON_ERROR_STOP=1 "postgresql://calivera_admin@/postgres?host=$dir&port=$port" \
  -c "CREATE DATABASE calivera_test" >"$dir/load.log" 2>&1 ||
  skip "cannot create the test database: $(tail -n 3 "$dir/load.log" | tr '\n' ' ')"
# Column types as a warehouse would hold them: every integer type, real, double precision,
# numeric and text.
if ! psql -X -q -v ON_ERROR_STOP=1 "$CALIVERA_PG_ADMIN_URI" >>"$dir/load.log" 2>&1 <<SQL; then
CREATE TABLE pima_tr (npreg integer, glu double precision, bp integer, skin integer,
  bmi numeric, ped double precision, age smallint, diabetic integer);
\copy pima_tr FROM '$data/pima_tr.csv' WITH (FORMAT csv, HEADER true)
CREATE TABLE pima_tr2 (npreg integer, glu double precision, bp bigint, skin integer,
  bmi numeric, ped real, age smallint, diabetic integer);
\copy pima_tr2 FROM '$data/pima_tr2.csv' WITH (FORMAT csv, HEADER true, NULL 'NA')
CREATE TABLE birthwt (low integer, age integer, lwt integer, race text, smoke integer,
  ptl integer, ht integer, ui integer, ftv integer, bwt integer);
\copy birthwt FROM '$data/birthwt.csv' WITH (FORMAT csv, HEADER true)
CREATE SEQUENCE calivera_sequence;
CREATE SCHEMA clinic;
CREATE VIEW clinic."Pima view" AS SELECT npreg, glu, bp, skin, bmi, ped, age,
  diabetic = 1 AS diabetic FROM pima_tr;
CREATE ROLE calivera_reader LOGIN PASSWORD '$reader_password';
GRANT USAGE ON SCHEMA clinic TO calivera_reader;
GRANT SELECT ON ALL TABLES IN SCHEMA public, clinic TO calivera_reader;
SQL
  skip "cannot load the test data: $(tail -n 5 "$dir/load.log" | tr '\n' ' ')"
fi

"$@"
