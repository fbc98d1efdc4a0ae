#!/usr/bin/env bash
# Submit a fluxlane yield study to a Slurm cluster as a job array (one shard per task) and a
# merge job that runs once every shard has finished (sbatch --dependency=afterok).
#
#   shared/slurm/submit-yield.sh LAYOUT SHARDS OUTDIR [fluxlane yield options...]
#
#   LAYOUT   the layout YAML file (a path every compute node can read)
#   SHARDS   number of array tasks N; task K runs samples [K S / N, (K + 1) S / N) of S
#   OUTDIR   folder on shared storage: parts/part-K.json, logs/, and the result yield.json
#   options  passed to every shard unchanged, e.g. --samples 100000 --seed 7 --spread-rn 2%
#            --mode replan (the same options for every task: yield-merge refuses parts of
#            different runs)
#
# Environment:
#   FLUXLANE      the command that runs fluxlane on the nodes (default: node on this
#                 repository's dist/cli/main.js; e.g. FLUXLANE=fluxlane for an installed package)
#   SBATCH_ARGS   extra sbatch options for both jobs, e.g. "--partition=cpu --time=02:00:00"
#   CPUS          CPUs per array task (default 1); each task uses that many worker threads
#
# Each task finds its shard in SLURM_ARRAY_TASK_ID / SLURM_ARRAY_TASK_COUNT (fluxlane yield reads
# them when --shard is not given). Prints the two job ids: "array JOBID" and "merge JOBID". The
# merged yield.json is byte for byte the result one machine gives for the same options.
set -euo pipefail

if [ "$#" -lt 3 ]; then
  sed -n '2,24p' "$0" | sed 's/^# \{0,1\}//' >&2
  exit 2
fi
layout="$1"
shards="$2"
outdir="$3"
shift 3
case "$shards" in
  '' | *[!0-9]*) echo "submit-yield.sh: SHARDS must be a positive integer, found '$shards'" >&2; exit 2 ;;
esac
if [ "$shards" -lt 1 ]; then echo "submit-yield.sh: SHARDS must be at least 1" >&2; exit 2; fi
here="$(cd "$(dirname "$0")/../.." && pwd)"
fluxlane="${FLUXLANE:-node $here/dist/cli/main.js}"
cpus="${CPUS:-1}"
mkdir -p "$outdir/parts" "$outdir/logs"
outdir="$(cd "$outdir" && pwd)"

# Options and paths are quoted once here and expanded by the task's shell; SLURM_ARRAY_TASK_ID is
# left for the task to expand.
quoted=""
for a in "$layout" "$@"; do quoted+=" $(printf '%q' "$a")"; done

# shellcheck disable=SC2086
array=$(sbatch --parsable ${SBATCH_ARGS:-} --job-name=fluxlane-yield --array="0-$((shards - 1))" \
  --cpus-per-task="$cpus" --output="$outdir/logs/shard-%a.out" \
  --wrap="$fluxlane yield$quoted --threads $cpus -o $(printf '%q' "$outdir")/parts/part-\$SLURM_ARRAY_TASK_ID.json")
array="${array%%;*}"
# shellcheck disable=SC2086
merge=$(sbatch --parsable ${SBATCH_ARGS:-} --job-name=fluxlane-yield-merge --dependency="afterok:$array" \
  --output="$outdir/logs/merge.out" \
  --wrap="$fluxlane yield-merge $(printf '%q' "$outdir")/parts/part-*.json -o $(printf '%q' "$outdir")/yield.json")
merge="${merge%%;*}"
echo "array $array"
echo "merge $merge"
