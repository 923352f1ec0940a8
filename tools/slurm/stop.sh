#!/usr/bin/env bash
# Stops the one-node Slurm cluster started by tools/slurm/start.sh: slurmd, slurmctld and munged,
# by the pids in their PID files (never by name). Idempotent: nothing running is not an error.
set -euo pipefail

dir=${GRIDPROOF_SLURM_DIR:-/var/tmp/gridproof-slurm}

stop() {
  local pidfile=$1 pid
  [ -s "$pidfile" ] || return 0
  pid=$(cat "$pidfile")
  if kill -0 "$pid" 2>/dev/null; then
    kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do
      # a zombie (state Z) is dead; PID 1 reaps it later
      if [ ! -r "/proc/$pid/stat" ] || sed -E 's/^[0-9]+ \(.*\) ([A-Za-z]).*/\1/' "/proc/$pid/stat" | grep -q Z; then
        break
      fi
      sleep 0.1
    done
  fi
  rm -f "$pidfile"
}

stop "$dir/run/slurmd.pid"
stop "$dir/run/slurmctld.pid"
stop /run/munge/munged.pid
echo "slurm: stopped"
