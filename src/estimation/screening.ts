/**
 * The outlier-screening loop of both estimators (single station: estimate.ts; network:
 * network/estimate-network.ts): solve; find the rejection candidates (Pope's τ > k, outliers.ts or
 * the network's own search); re-estimate the observation weights where the estimator does that
 * (variance components); reject the candidates; re-solve while either changed anything. Screening
 * stops at `maxRejections` with a warning and `screeningComplete` false; the weights may still settle
 * after that.
 *
 * Pope (1976), "The statistics of residuals and the detection of outliers", NOAA Technical Report
 * NOS 65 NGS 1 (from memory): τ_i = v_i / (σ̂0 σ_v_i), with σ̂0 from the same solution.
 */

export interface ScreeningSteps<Solution, Candidate> {
  /** One solution with the observations not yet rejected and the current weights. */
  solve(): Solution;
  /** σ̂0² of a solution; null without degrees of freedom. */
  varianceFactor(solution: Solution): number | null;
  /** The candidates of this pass, largest |τ| first (σ̂0 = √VF, 1 when VF is null). */
  candidates(solution: Solution, sigmaZero: number): Candidate[];
  normalizedResidual(candidate: Candidate): number;
  /** Takes the candidate out of the next solutions (and records it). */
  reject(candidate: Candidate, solution: Solution): void;
  /** Re-estimates the observation weights from this solution; true when they changed. */
  reweight?(solution: Solution, varianceFactor: number | null): boolean;
}

export interface ScreenedSolution<Solution> {
  solution: Solution;
  varianceFactor: number | null;
  solutions: number;
  rejections: number;
  screeningComplete: boolean;
  warnings: string[];
}

/**
 * @param threshold k of |τ| > k; null: no screening (the weights may still be re-estimated)
 * @param maxRejections rejections at most over all passes
 */
export function screenedSolution<Solution, Candidate>(
  steps: ScreeningSteps<Solution, Candidate>,
  threshold: number | null,
  maxRejections: number,
): ScreenedSolution<Solution> {
  const warnings: string[] = [];
  let screening = threshold !== null;
  let screeningComplete = true;
  let solutions = 0;
  let rejections = 0;
  for (;;) {
    const solution = steps.solve();
    solutions++;
    const varianceFactor = steps.varianceFactor(solution);
    const candidates = screening ? steps.candidates(solution, varianceFactor === null ? 1 : Math.sqrt(varianceFactor)) : [];
    let changed = steps.reweight ? steps.reweight(solution, varianceFactor) : false;
    if (candidates.length > 0 && rejections >= maxRejections) {
      screeningComplete = false;
      screening = false;
      warnings.push(
        `outlier screening stopped after ${rejections} rejections (options.max_rejections); ${candidates.length > 1 ? 'normalised residuals' : 'a normalised residual'} up to ${Math.abs(steps.normalizedResidual(candidates[0]!)).toFixed(1)} remain above ${threshold}: check sigma0_m and the residuals`,
      );
    } else {
      for (const c of candidates.slice(0, maxRejections - rejections)) {
        steps.reject(c, solution);
        rejections++;
        changed = true;
      }
    }
    if (!changed) return { solution, varianceFactor, solutions, rejections, screeningComplete, warnings };
  }
}
