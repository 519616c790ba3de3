// Loaded into a CLI run by the benchmark (`node --import ./test/bench/peakMemory.mjs ...`):
// writes the process's peak resident set size (kB, worker threads included) to the file named
// by FOURFOLD_BENCH_PEAK_FILE when the process exits.
import { writeFileSync } from 'node:fs';

const file = process.env.FOURFOLD_BENCH_PEAK_FILE;
if (file) process.on('exit', () => writeFileSync(file, String(process.resourceUsage().maxRSS)));
