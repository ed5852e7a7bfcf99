/**
 * What a reader must keep in mind before quoting a fit: shown at the top of every report, in plain words.
 * The statistical error bars assume the stellar model is right; the model is the larger uncertainty.
 */
export interface CautionContext {
  /** Name of the stellar model that produced the numbers. */
  modelName: string;
  /** True for coeval's built-in model (approximate by design), false for a user's grid. */
  builtin: boolean;
  /** The convergence verdict: anything but 'converged' is repeated here. */
  verdictStatus: 'converged' | 'run-longer' | 'problems';
  /** The run's status from its manifest (e.g. 'interrupted'). */
  runStatus?: string;
  /** The catalogue was simulated and the truth is known. */
  simulated?: boolean;
}

export function reportCautions(c: CautionContext): string[] {
  const out: string[] = [];
  if (c.verdictStatus !== 'converged') {
    out.push('The chains have not passed the convergence checks (see the verdict below): these numbers are provisional and should not be quoted yet.');
  }
  if (c.runStatus && c.runStatus !== 'finished') out.push(`The run did not finish normally (status "${c.runStatus}"): the report shows the draws stored so far.`);
  if (c.builtin) {
    out.push(
      `The numbers come from ${c.modelName}, coeval's built-in stellar model. It is an approximation: analytic fits to evolutionary tracks joined to published colour and bolometric-correction relations, each used with known limits (listed under Provenance). It serves to explore data and test a set-up, not to produce final results.`,
    );
  } else {
    out.push(`The numbers come from the isochrone grid "${c.modelName}" and inherit its physics, its colour transformations and their limits.`);
  }
  out.push(
    'The error bars are statistical only: they hold if the stellar model is exactly right. Fitting the same stars with a different model (another evolution code, colour calibration, helium content or alpha-element mix) usually moves the age, distance and metallicity by more than these error bars.',
  );
  out.push(
    'Before publishing, fit with an established published isochrone grid (import it with `coeval grid import`), repeat the fit with a second grid to see how far the answer moves, and compare the result with what the literature reports for this cluster and for similar ones.',
  );
  if (c.simulated) out.push('The catalogue is simulated: the true parameter values are known and marked in the corner plot.');
  return out;
}
