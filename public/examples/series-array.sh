#!/bin/sh
# A series of Maps as a job array on a Slurm cluster: each array task computes its piece of
# every map of the series, then one job, started after them, merges the pieces into each map's
# JSON and draws the figure of small multiples. From the repository folder (after npm ci):
#
#   sbatch --parsable --array=1-16 public/examples/series-array.sh          # prints JOBID
#   sbatch --dependency=afterok:JOBID public/examples/series-array.sh       # merge and figure
#
# Number the tasks from 1 (--array=1-N). A task that is run again (a requeued job, a rerun of
# the whole array) keeps the pieces that are already finished, and the last job computes any
# piece still missing, so nothing is lost when a task runs out of time. The series is set below;
# change it there, or when submitting (sbatch --export=ALL,VALUES=0:1:11 ...).
#SBATCH --job-name=fourfold-series
#SBATCH --cpus-per-task=2
#SBATCH --mem=2G
#SBATCH --time=02:00:00
set -eu
MODEL=${MODEL:-public/examples/sample-map.json}
VARY=${VARY:-zeeman}
VALUES=${VALUES:-0.1,0.3,0.5,0.7}
OUT=${OUT:-series}
THREADS=${SLURM_CPUS_PER_TASK:-1}
cd "${SLURM_SUBMIT_DIR:-.}"
if [ -n "${SLURM_ARRAY_TASK_ID:-}" ]; then
  exec npm run --silent series -- --model "$MODEL" --vary "$VARY" --values "$VALUES" \
    --shard "$SLURM_ARRAY_TASK_ID/$SLURM_ARRAY_TASK_COUNT" --threads "$THREADS" --out "$OUT"
fi
exec npm run --silent series -- --model "$MODEL" --vary "$VARY" --values "$VALUES" \
  --threads "$THREADS" --out "$OUT"
