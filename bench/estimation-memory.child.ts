/**
 * Child process of bench/estimation.bench.ts: runs the estimator on N days of 30 s synthetic data
 * (argument 1, default 7) in a fresh process and prints its memory figures as JSON. A separate
 * process, so that the peak resident set size (getrusage maxRSS) belongs to this run alone.
 */

import { resourceUsage } from 'node:process';
import { generateSyntheticResiduals } from '../scripts/synthetic-residuals.js';
import { estimateZwd } from '../src/estimation/estimate.js';
import { toEstimationInput } from '../test/helpers/synthetic-input.js';

const days = Number(process.argv[2] ?? 7);
const data = generateSyntheticResiduals({ durationS: days * 86_400, grossErrors: 5 * days });
const input = toEstimationInput(data, 46.2, { scaleSigmas: true });
const rssBeforeMb = process.memoryUsage().rss / 1e6;
const maxRssBeforeMb = resourceUsage().maxRSS / 1e3;
const started = performance.now();
const output = estimateZwd(input);
const elapsedMs = performance.now() - started;
process.stdout.write(
  JSON.stringify({
    days,
    observations: output.statistics.observationsTotal,
    epochs: output.statistics.epochs,
    rssBeforeMb,
    maxRssBeforeMb,
    maxRssMb: resourceUsage().maxRSS / 1e3,
    elapsedMs,
  }) + '\n',
);
