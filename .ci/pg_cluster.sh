#!/usr/bin/env bash
# A throwaway PostgreSQL cluster for the tests: 127.0.0.1 only, on a free port, in a temporary
# folder, run by an unprivileged user (initdb refuses root).
#
#   eval "$(.ci/pg_cluster.sh start)"   # prints export SHAFTBENCH_TEST_PG_URL=... and PG_CLUSTER_DIR=...
#   .ci/pg_cluster.sh stop              # stops it and removes its folder (uses $PG_CLUSTER_DIR)
#
# Installs the Debian package postgresql if the server binaries are missing (needs root).
set -euo pipefail

find_bin() {
    local dir
    for dir in /usr/lib/postgresql/*/bin; do
        if [ -x "$dir/initdb" ] && [ -x "$dir/pg_ctl" ]; then echo "$dir"; return 0; fi
    done
    return 1
}

start() {
    local bin
    if ! bin=$(find_bin); then
        echo "installing the postgresql package" >&2
        export DEBIAN_FRONTEND=noninteractive
        apt-get update -qq >&2 && apt-get install -y -qq postgresql >&2
        bin=$(find_bin)
    fi
    local dir port owner
    dir=$(mktemp -d /tmp/shaftbench-pg.XXXXXX)
    port=$(python3 -c 'import socket; s=socket.socket(); s.bind(("127.0.0.1", 0)); print(s.getsockname()[1]); s.close()')
    run_as=()
    owner=$(id -un)
    if [ "$(id -u)" = 0 ]; then
        owner=nobody
        chown "$owner" "$dir"
        run_as=(runuser -u "$owner" --)
    fi
    chmod 700 "$dir"
    "${run_as[@]}" "$bin/initdb" -D "$dir/data" -U shaftbench --auth=trust -E UTF8 --locale=C.UTF-8 >"$dir/initdb.log" 2>&1 \
        || { cat "$dir/initdb.log" >&2; exit 1; }
    "${run_as[@]}" "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w -t 60 \
        -o "-c listen_addresses=127.0.0.1 -p $port -k $dir -c fsync=on -c max_connections=60" start >&2 \
        || { cat "$dir/server.log" >&2; exit 1; }
    "${run_as[@]}" "$bin/createdb" -h 127.0.0.1 -p "$port" -U shaftbench shaftbench_test >&2
    echo "export PG_CLUSTER_DIR=$dir PG_CLUSTER_BIN=$bin"
    echo "export SHAFTBENCH_TEST_PG_URL=postgresql://shaftbench@127.0.0.1:$port/shaftbench_test"
}

stop() {
    local dir=${PG_CLUSTER_DIR:-} bin=${PG_CLUSTER_BIN:-}
    [ -n "$dir" ] && [ -d "$dir" ] || { echo "no cluster to stop" >&2; return 0; }
    [ -n "$bin" ] || bin=$(find_bin)
    if [ -f "$dir/data/postmaster.pid" ]; then
        if [ "$(id -u)" = 0 ]; then
            runuser -u "$(stat -c %U "$dir/data")" -- "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >&2 || true
        else
            "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >&2 || true
        fi
    fi
    rm -rf "$dir"
}

case "${1:-}" in
    start) start ;;
    stop) stop ;;
    *) echo "usage: $0 start|stop" >&2; exit 2 ;;
esac
