#!/usr/bin/env bash
# Starts a one-node Slurm cluster on this machine for gridproof's batch tests and examples:
# munged, slurmctld and slurmd, as root, without systemd. Idempotent: a running cluster started by
# this script is left as it is. Needs Debian's slurmctld, slurmd, slurm-client and munge packages.
# State, spool, PID and log files live under $GRIDPROOF_SLURM_DIR (default /var/tmp/gridproof-slurm).
# The configuration (/etc/slurm/slurm.conf) and the ports 6817/6818 are global: one cluster per
# machine. A configuration this script did not write is never overwritten.
set -euo pipefail

dir=${GRIDPROOF_SLURM_DIR:-/var/tmp/gridproof-slurm}
conf=/etc/slurm/slurm.conf
mark="# written by gridproof tools/slurm/start.sh"

fail() { echo "slurm:start: $*" >&2; exit 2; }

[ "$(id -u)" = 0 ] || fail "run as root (the daemons run as root here; see docs/cluster.md)"
for program in munged slurmctld slurmd sinfo; do
  command -v "$program" >/dev/null 2>&1 ||
    fail "$program is missing: apt-get install -y --no-install-recommends slurmctld slurmd slurm-client munge"
done

# A pid file names a live daemon when the process exists and is not a zombie (state Z): PID 1
# reaps slowly here, so a dead daemon lingers as a zombie for about a second.
alive() {
  local pidfile=$1 pid state
  [ -s "$pidfile" ] || return 1
  pid=$(cat "$pidfile")
  [ -r "/proc/$pid/stat" ] || return 1
  state=$(sed -E 's/^[0-9]+ \(.*\) ([A-Za-z]).*/\1/' "/proc/$pid/stat")
  [ "$state" != Z ]
}

mkdir -p "$dir/state" "$dir/spool" "$dir/log" "$dir/run"
node=$(hostname -s)
cpus=$(nproc)
memory=$(awk '/MemTotal/ { print int($2 / 1024 * 0.9) }' /proc/meminfo)

if [ -e "$conf" ] && ! grep -qF "$mark" "$conf"; then
  fail "$conf exists and was not written by this script; leave it, or move it away and run again"
fi
mkdir -p /etc/slurm
cat > "$conf.new" <<CONF
$mark
ClusterName=gridproof
SlurmctldHost=$node(127.0.0.1)
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
AccountingStorageType=accounting_storage/none
JobAcctGatherType=jobacct_gather/none
JobCompType=jobcomp/none
MailProg=/bin/true
ReturnToService=2
SchedulerParameters=batch_sched_delay=0
MpiDefault=none
StateSaveLocation=$dir/state
SlurmdSpoolDir=$dir/spool
SlurmctldPidFile=$dir/run/slurmctld.pid
SlurmdPidFile=$dir/run/slurmd.pid
SlurmctldLogFile=$dir/log/slurmctld.log
SlurmdLogFile=$dir/log/slurmd.log
NodeName=$node CPUs=$cpus RealMemory=$memory State=UNKNOWN
PartitionName=main Nodes=$node Default=YES MaxTime=INFINITE State=UP
CONF
if ! cmp -s "$conf.new" "$conf" 2>/dev/null; then
  mv "$conf.new" "$conf"
  changed=1
else
  rm -f "$conf.new"
  changed=0
fi

# munge: the package makes the key and the user, not the run folder
mkdir -p /run/munge
chown munge:munge /run/munge
if ! alive /run/munge/munged.pid; then
  su -s /bin/sh munge -c "munged --pid-file=/run/munge/munged.pid" ||
    fail "munged did not start; see /var/log/munge/munged.log"
fi

if [ "$changed" = 1 ] && alive "$dir/run/slurmctld.pid"; then
  scontrol reconfigure >/dev/null 2>&1 || true
fi
if ! alive "$dir/run/slurmctld.pid"; then
  slurmctld || fail "slurmctld did not start; see $dir/log/slurmctld.log"
fi
if ! alive "$dir/run/slurmd.pid"; then
  slurmd -N "$node" || fail "slurmd did not start; see $dir/log/slurmd.log"
fi

# wait until the node takes jobs
for _ in $(seq 1 150); do
  state=$(sinfo -h -n "$node" -o %T 2>/dev/null || true)
  case "$state" in
    idle* | mixed* | allocated*) echo "slurm: node $node is $state ($cpus CPUs); files in $dir"; exit 0 ;;
    down* | drain*) scontrol update NodeName="$node" State=RESUME >/dev/null 2>&1 || true ;;
  esac
  sleep 0.2
done
fail "node $node did not become idle within 30 s (state: ${state:-unknown}); see $dir/log"
