#!/usr/bin/env bash
# The VT_DIR of a Virtuoso started by .ci/virtuoso-start.sh → that server stopped, by its saved PID.
#   VT_DIR=<dir> .ci/virtuoso-stop.sh      (VT_PURGE=1 also deletes VT_DIR)
set -euo pipefail
VT_DIR=${VT_DIR:?set VT_DIR}
PIDFILE="$VT_DIR/virtuoso.pid"
[ -f "$PIDFILE" ] || { echo "no pid file in $VT_DIR" >&2; exit 0; }
PID=$(cat "$PIDFILE")
if kill -0 "$PID" 2>/dev/null; then
  kill -TERM "$PID"            # virtuoso-t checkpoints and exits on SIGTERM
  for _ in $(seq 1 150); do kill -0 "$PID" 2>/dev/null || break; sleep 0.2; done
  if kill -0 "$PID" 2>/dev/null; then echo "pid $PID still alive after 30s, SIGKILL" >&2; kill -KILL "$PID"; fi
fi
rm -f "$PIDFILE"
echo "virtuoso stopped (pid $PID)"
if [ "${VT_PURGE:-0}" = 1 ]; then rm -rf "$VT_DIR"; fi
