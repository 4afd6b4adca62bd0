#!/usr/bin/env bash
# An empty directory → a private Virtuoso 7 (Debian package virtuoso-opensource)
# bound to loopback only, ready when SQL and HTTP answer; used by .ci/run.
#
#   VT_DIR=<dir> VT_SQL_PORT=21111 VT_HTTP_PORT=28890 .ci/virtuoso-start.sh
#
# (Defaults are 21111/28890, not Virtuoso's 1111/8890, so a system instance
# started by the package's init script can never collide with this one.)
# Login for isql-vt and HTTP Digest on a fresh database: dba / dba.
#
# Writes   $VT_DIR/virtuoso.ini, $VT_DIR/db/*, $VT_DIR/virtuoso.pid
# Stop with .ci/virtuoso-stop.sh (same VT_DIR).
# Optional: VT_BUFFERS (default 170000 = ~1.3 GiB page cache),
#           VT_LOAD_DIR (extra directory the bulk loader may read; default $VT_DIR/load),
#           VT_TIMEOUT  (seconds to wait for readiness; default 60),
#           VT_SCHEDULER_INTERVAL, VT_THREADS_PER_QUERY, VT_AQ_THREADS (tuning knobs;
#           setting them to 0 / 1 / 1 did not stop deadlocks on very large Graph Store
#           uploads, which is why concordat uploads in chunks of ≤100k triples).
set -euo pipefail

VT_DIR=${VT_DIR:?set VT_DIR to an empty or non-existent directory}
VT_SQL_PORT=${VT_SQL_PORT:-21111}
VT_HTTP_PORT=${VT_HTTP_PORT:-28890}
VT_BUFFERS=${VT_BUFFERS:-170000}
VT_DIRTY=$(( VT_BUFFERS * 3 / 4 ))
VT_TIMEOUT=${VT_TIMEOUT:-60}

mkdir -p "$VT_DIR/db" "$VT_DIR/vsp"
VT_DIR=$(cd "$VT_DIR" && pwd)
VT_LOAD_DIR=${VT_LOAD_DIR:-$VT_DIR/load}
mkdir -p "$VT_LOAD_DIR"

if [ -f "$VT_DIR/virtuoso.pid" ] && kill -0 "$(cat "$VT_DIR/virtuoso.pid")" 2>/dev/null; then
  echo "already running: pid $(cat "$VT_DIR/virtuoso.pid")" >&2; exit 1
fi

cat > "$VT_DIR/virtuoso.ini" <<EOF
[Database]
DatabaseFile       = $VT_DIR/db/virtuoso.db
ErrorLogFile       = $VT_DIR/db/virtuoso.log
LockFile           = $VT_DIR/db/virtuoso.lck
TransactionFile    = $VT_DIR/db/virtuoso.trx
xa_persistent_file = $VT_DIR/db/virtuoso.pxa
ErrorLogLevel      = 7
FileExtend         = 200
MaxCheckpointRemap = 2000
Striping           = 0
TempStorage        = TempDatabase

[TempDatabase]
DatabaseFile       = $VT_DIR/db/virtuoso-temp.db
TransactionFile    = $VT_DIR/db/virtuoso-temp.trx
MaxCheckpointRemap = 2000
Striping           = 0

[Parameters]
ServerPort               = 127.0.0.1:$VT_SQL_PORT
DisableUnixSocket        = 1
DisableTcpSocket         = 0
MaxClientConnections     = 10
CheckpointInterval       = 60
O_DIRECT                 = 0
CaseMode                 = 2
MaxStaticCursorRows      = 5000
AllowOSCalls             = 0
SchedulerInterval        = ${VT_SCHEDULER_INTERVAL:-10}
DirsAllowed              = ., $VT_DIR, $VT_LOAD_DIR
ThreadCleanupInterval    = 0
ThreadThreshold          = 10
ResourcesCleanupInterval = 0
FreeTextBatchSize        = 100000
SingleCPU                = 0
PrefixResultNames        = 0
RdfFreeTextRulesSize     = 100
IndexTreeMaps            = 64
MaxQueryMem              = 1G
VectorSize               = 1000
MaxVectorSize            = 1000000
AdjustVectorSize         = 0
ThreadsPerQuery          = ${VT_THREADS_PER_QUERY:-2}
AsyncQueueMaxThreads     = ${VT_AQ_THREADS:-10}
NumberOfBuffers          = $VT_BUFFERS
MaxDirtyBuffers          = $VT_DIRTY

[HTTPServer]
ServerPort                  = 127.0.0.1:$VT_HTTP_PORT
ServerRoot                  = $VT_DIR/vsp
MaxClientConnections        = 10
DavRoot                     = DAV
EnabledDavVSP               = 0
HTTPProxyEnabled            = 0
TempASPXDir                 = 0
ServerThreads               = 10
MaxKeepAlives               = 10
KeepAliveTimeout            = 10
HTTPThreadSize              = 280000
HttpPrintWarningsInOutput   = 0
Charset                     = UTF-8
EnabledGzipContent          = 1

[Client]
SQL_PREFETCH_ROWS  = 100
SQL_PREFETCH_BYTES = 16000
SQL_QUERY_TIMEOUT  = 0
SQL_TXN_TIMEOUT    = 0

[Replication]
ServerName   = db
ServerEnable = 1
QueueMax     = 50000

[URIQA]
DynamicLocal = 0
DefaultHost  = localhost:$VT_HTTP_PORT

[SPARQL]
ResultSetMaxRows           = 1000000
MaxQueryCostEstimationTime = 400
MaxQueryExecutionTime      = 60
DeferInferenceRulesInit    = 0
EOF

t0=$(date +%s.%N)
# +foreground keeps virtuoso-t as our child, so $! is the server's own PID.
( cd "$VT_DIR" && exec virtuoso-t +foreground +configfile "$VT_DIR/virtuoso.ini" ) \
  > "$VT_DIR/virtuoso.stdout" 2>&1 < /dev/null &
PID=$!
echo "$PID" > "$VT_DIR/virtuoso.pid"

deadline=$(( $(date +%s) + VT_TIMEOUT ))
until curl -fsS -o /dev/null "http://127.0.0.1:$VT_HTTP_PORT/sparql?query=ASK%7B%7D" 2>/dev/null \
   && isql-vt "127.0.0.1:$VT_SQL_PORT" dba dba 'EXEC=select 1;' >/dev/null 2>&1; do
  if ! kill -0 "$PID" 2>/dev/null; then
    echo "virtuoso-t exited during startup; log:" >&2; tail -30 "$VT_DIR/db/virtuoso.log" >&2 || true; exit 1
  fi
  if [ "$(date +%s)" -ge "$deadline" ]; then
    echo "not ready after ${VT_TIMEOUT}s; stopping pid $PID" >&2; kill "$PID" || true; exit 1
  fi
  sleep 0.2
done
t1=$(date +%s.%N)
awk -v a="$t0" -v b="$t1" -v p="$PID" -v s="$VT_SQL_PORT" -v h="$VT_HTTP_PORT" \
  'BEGIN { printf "virtuoso ready: pid %s sql 127.0.0.1:%s http 127.0.0.1:%s in %.2fs\n", p, s, h, b - a }'
