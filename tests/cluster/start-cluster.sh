#!/bin/sh
# Starts a one-node SLURM cluster on localhost (munged, slurmctld, slurmd -N localhost) for
# the integration tests. Idempotent: does nothing when the cluster already answers.
# Needs root and Debian's packages: apt-get -o DPkg::Lock::Timeout=300 install -y slurm-wlm munge
set -eu
here=$(cd "$(dirname "$0")" && pwd)
state=${MIDPATH_SLURM_STATE:-/var/lib/midpath-slurm}

if scontrol ping 2>/dev/null | grep -q 'is UP' && sinfo -h -o %T 2>/dev/null | grep -Eq 'idle|mix|alloc'; then
  echo "slurm: already running"
  exit 0
fi

# munge: the key must belong to munge with mode 0400, and munged must run as munge.
mkdir -p /etc/munge /run/munge /var/lib/munge /var/log/munge
if [ ! -s /etc/munge/munge.key ]; then
  dd if=/dev/urandom of=/etc/munge/munge.key bs=1024 count=1 2>/dev/null
fi
chown -R munge:munge /etc/munge /run/munge /var/lib/munge /var/log/munge
chmod 0700 /etc/munge
chmod 0400 /etc/munge/munge.key
if ! munge -n 2>/dev/null | unmunge >/dev/null 2>&1; then
  runuser -u munge -- /usr/sbin/munged
fi

mkdir -p /etc/slurm "$state/ctld" "$state/d"
sed -e "s|@STATE@|$state|g" -e "s|@CPUS@|$(nproc)|g" "$here/slurm.conf.in" > /etc/slurm/slurm.conf

# Decide by asking the daemons, not by process names: a container whose init does not reap
# leaves zombie processes that pgrep still lists.
alive() { [ -s "$1" ] && [ -d "/proc/$(cat "$1")" ] && ! grep -q '^State:.*Z' "/proc/$(cat "$1")/status" 2>/dev/null; }
scontrol ping 2>/dev/null | grep -q 'is UP' || slurmctld
alive "$state/slurmd.pid" || slurmd -N localhost

i=0
until sinfo -h -o %T 2>/dev/null | grep -Eq 'idle|mix|alloc'; do
  i=$((i + 1))
  if [ "$i" -gt 60 ]; then
    echo "slurm: the node did not come up; see $state/slurmctld.log and $state/slurmd.log" >&2
    exit 1
  fi
  # A node left DOWN by an earlier unclean stop comes back with an explicit resume.
  scontrol update nodename=localhost state=resume >/dev/null 2>&1 || true
  sleep 1
done
echo "slurm: up ($(sinfo -h -o '%P %D %T %c CPUs'))"
