#!/usr/bin/env bash
# CI: a sharded yield run on a real one-node Slurm cluster equals the single-machine run, byte
# for byte. Installs Debian's Slurm and munge, starts munged, slurmctld and slurmd with a
# throw-away configuration (in a temporary folder; /etc/slurm is not touched), submits a demo's
# yield study with shared/slurm/submit-yield.sh (a job array of 4 shards and a dependent merge
# job), waits for the merge, compares with `fluxlane yield` run here, and stops the daemons by
# the process ids it started. Run as root (CI does) after `npm ci` (it needs dist/).
set -euo pipefail
cd "$(dirname "$0")/.."
repo="$(pwd)"
export DEBIAN_FRONTEND=noninteractive

echo "== slurm: install slurmctld, slurmd, slurm-client, munge"
packages=(slurmctld slurmd slurm-client munge)
apt-get install -y -q --no-install-recommends "${packages[@]}" >/dev/null ||
  { apt-get update -q >/dev/null && apt-get install -y -q --no-install-recommends "${packages[@]}" >/dev/null; }

work="$(mktemp -d /tmp/fluxlane-slurm.XXXXXX)"
chmod 755 "$work"
pids=()
munge_pid=""
cleanup() {
  status=$?
  for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${pids[@]}"; do wait "$pid" 2>/dev/null || true; done
  if [ -n "$munge_pid" ]; then kill "$munge_pid" 2>/dev/null || true; fi
  if [ "$status" -ne 0 ]; then
    echo "== slurm test failed; logs:" >&2
    for f in "$work"/slurmctld.log "$work"/slurmd.log "$work"/slurmctld.out "$work"/slurmd.out "$work"/out/logs/*; do [ -f "$f" ] && { echo "--- $f" >&2; tail -n 30 "$f" >&2; }; done
  fi
  rm -rf "$work"
  exit "$status"
}
trap cleanup EXIT

echo "== munge: key and daemon"
if munge -n 2>/dev/null | unmunge >/dev/null 2>&1; then
  echo "a munged is running already: using it"
else
  [ -f /etc/munge/munge.key ] || /usr/sbin/mungekey --create
  chown munge:munge /etc/munge/munge.key
  chmod 400 /etc/munge/munge.key
  mkdir -p /run/munge && chown munge:munge /run/munge
  pidfile=/run/munge/munged-fluxlane-ci.pid
  rm -f "$pidfile"
  su -s /bin/sh munge -c "/usr/sbin/munged --pid-file=$pidfile"
  for _ in $(seq 1 50); do [ -s "$pidfile" ] && break; sleep 0.1; done
  munge_pid="$(cat "$pidfile")"
  munge -n | unmunge >/dev/null
fi

echo "== slurm: configuration in $work, daemons in the foreground"
host="$(hostname)"
cpus="$(nproc)"
mem="$(awk '/MemTotal/ { printf "%d", $2 / 1024 * 0.8 }' /proc/meminfo)"
mkdir -p "$work/state" "$work/spool"
cat >"$work/slurm.conf" <<CONF
ClusterName=fluxlane-ci
SlurmctldHost=$host
AuthType=auth/munge
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
SlurmUser=root
ReturnToService=2
JobAcctGatherType=jobacct_gather/none
SlurmctldPidFile=$work/slurmctld.pid
SlurmdPidFile=$work/slurmd.pid
StateSaveLocation=$work/state
SlurmdSpoolDir=$work/spool
SlurmctldLogFile=$work/slurmctld.log
SlurmdLogFile=$work/slurmd.log
NodeName=$host CPUs=$cpus RealMemory=$mem State=UNKNOWN
PartitionName=main Nodes=ALL Default=YES MaxTime=INFINITE State=UP
CONF
export SLURM_CONF="$work/slurm.conf"
/usr/sbin/slurmctld -D -i -f "$SLURM_CONF" >"$work/slurmctld.out" 2>&1 &
pids+=("$!")
sleep 1
/usr/sbin/slurmd -D -f "$SLURM_CONF" >"$work/slurmd.out" 2>&1 &
pids+=("$!")
for _ in $(seq 1 60); do
  state="$(sinfo -h -N -o '%t' 2>/dev/null | head -n 1 || true)"
  [ "$state" = "idle" ] && break
  sleep 0.5
done
[ "$state" = "idle" ] || { echo "slurm node did not come up (state '$state')" >&2; exit 1; }
sinfo

study=(--samples 600 --seed 5 --sweep-spread 1%,2%,4%)
echo "== the single-machine run: fluxlane yield layouts/clove-17.yaml ${study[*]}"
node dist/cli/main.js yield layouts/clove-17.yaml "${study[@]}" --threads 2 -o "$work/single.json" >/dev/null

echo "== the cluster run: 4 shards and a dependent merge"
submitted="$(shared/slurm/submit-yield.sh layouts/clove-17.yaml 4 "$work/out" "${study[@]}")"
echo "$submitted"
merge="$(echo "$submitted" | awk '/^merge / { print $2 }')"
for _ in $(seq 1 600); do
  if ! squeue -h -j "$merge" 2>/dev/null | grep -q .; then break; fi
  sleep 1
done
[ -f "$work/out/yield.json" ] || { echo "the merge job wrote no yield.json" >&2; exit 1; }
ls "$work/out/parts"
if cmp "$work/single.json" "$work/out/yield.json"; then
  echo "ok: the merged Slurm result equals the single-machine result byte for byte ($(wc -c <"$work/single.json") bytes)"
else
  diff <(head -c 2000 "$work/single.json") <(head -c 2000 "$work/out/yield.json") >&2 || true
  exit 1
fi
