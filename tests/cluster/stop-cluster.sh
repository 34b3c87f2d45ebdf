#!/bin/sh
# Stops the one-node test cluster started by start-cluster.sh. Idempotent.
set -u
state=${MIDPATH_SLURM_STATE:-/var/lib/midpath-slurm}
for name in slurmd slurmctld; do
  pidfile="$state/$name.pid"
  if [ -s "$pidfile" ] && kill "$(cat "$pidfile")" 2>/dev/null; then
    echo "slurm: stopped $name"
  fi
  rm -f "$pidfile"  # so a later start never mistakes a leftover (or zombie) pid for a daemon
done
# munged keeps running only if we started it; its pid file is munge's own.
if [ -s /run/munge/munged.pid ] && kill "$(cat /run/munge/munged.pid)" 2>/dev/null; then
  echo "munge: stopped munged"
fi
rm -f /run/munge/munged.pid
exit 0
