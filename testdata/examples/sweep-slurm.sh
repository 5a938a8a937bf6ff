#!/bin/bash
# Certify a family in four shards, one Slurm job-array task per shard.
#
#   sbatch testdata/examples/sweep-slurm.sh
#
# Each task writes its own directory; a task that is killed or requeued
# resumes where it stopped (certificates already written are verified and
# kept). When the array has finished, merge the shards:
#
#   sbatch --dependency=afterok:<array job id> --wrap \
#     'gapcert merge results/triangles/shard-0 results/triangles/shard-1 results/triangles/shard-2 results/triangles/shard-3 --out results/triangles/merged'
#
#SBATCH --job-name=gapcert-sweep
#SBATCH --array=0-3
#SBATCH --cpus-per-task=2
#SBATCH --time=01:00:00
#SBATCH --output=gapcert-sweep-%A_%a.log

set -euo pipefail

FAMILY=testdata/examples/triangle_apex_family.json
OUT=results/triangles/shard-$SLURM_ARRAY_TASK_ID

gapcert sweep "$FAMILY" --shard "$SLURM_ARRAY_TASK_ID/4" --out "$OUT" \
  --jobs "${SLURM_CPUS_PER_TASK:-1}" --quiet
