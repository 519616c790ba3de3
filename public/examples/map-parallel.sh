#!/bin/sh
# One Map in 8 pieces with GNU parallel, 4 at a time (add --sshloginfile FILE --workdir . to
# spread them over machines that share this folder), then merged into the very file that
# `map --out` writes.
# From the repository folder (after npm ci).
set -eu
MODEL=${MODEL:-public/examples/sample-map.json}
OUT=${OUT:-sample-map.json}
PARTS=${PARTS:-parts}
mkdir -p "$PARTS"
parallel -j 4 npm run --silent map -- --model "$MODEL" --shard {}/8 --threads 1 --out "$PARTS/part-{}.json" ::: 1 2 3 4 5 6 7 8
npm run --silent merge -- --out "$OUT" "$PARTS"/part-*.json
