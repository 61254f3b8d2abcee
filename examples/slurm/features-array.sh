#!/bin/sh
# Measure the features of every trace of an archive as a Slurm job array.
# Each array task takes one shard of the list (tracesift reads
# SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT) and keeps its own
# journal, so a task that is killed (time limit, preemption, a node lost)
# carries on where it stopped when it is submitted again.
#
# From the directory holding traces.txt (one trace path per line):
#
#   find /data/archive -name '*.csv*' > traces.txt
#   mkdir -p out && sbatch path/to/features-array.sh        # tasks 0-3
#   # when every task has ended:
#   tracesift collate out/features.*.csv -o features.csv
#
# features.csv is then byte for byte what one `tracesift features
# --files-from traces.txt --format csv -o features.csv` writes;
# collate names any trace that is missing (a task that did not finish)
# or duplicated. To run one task again — it skips what its journal already
# holds — give the shard count, since a one-task array has a count of 1:
#
#   sbatch --array=2 path/to/features-array.sh --shards 4
#
# Arguments after the script are passed to tracesift (e.g. --all for the
# whole vector with the extended network families, about 17 times the
# cost); give every submission of one batch the same arguments, or its
# records will not match. TRACESIFT names the
# binary (default: tracesift on PATH). The tests run this script on a
# one-node cluster (integration/slurm/slurm_test.go), overriding --array,
# --output, --cpus-per-task and --mem on the sbatch command line.
#
#SBATCH --job-name=tracesift-features
#SBATCH --array=0-3
#SBATCH --cpus-per-task=2
#SBATCH --mem=2G
#SBATCH --time=04:00:00
#SBATCH --output=out/slurm-%A_%a.log
set -eu
exec "${TRACESIFT:-tracesift}" features --files-from traces.txt --format csv --resume \
	-o "out/features.${SLURM_ARRAY_TASK_ID}.csv" "$@"
