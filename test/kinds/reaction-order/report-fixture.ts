import type { CheckResult } from '../../../schemas/result.ts';
import type { KindResult } from '../../../reports/feedback-input.ts';
import { Settings, Submission, type Refit } from '../../../kinds/reaction-order/schemas.ts';

/**
 * A hand-made result of the kind `reaction-order`, for the report's tests and its rendered pages: an
 * invented dye fading at its absorption maximum (epsilon 2.4e4 M^-1 cm^-1, l 1 cm, A_inf 0.020), two
 * runs ([A]_0 3.0e-5 and 1.5e-5 M) read every 4 min for 40 min, first order with k 0.045 min^-1 and
 * absorbance noise of SD 0.003, rounded to 0.001. The refit below was computed outside our code, with
 * numpy 2.4.6 (each law's straight line: a common slope, an intercept per run, by lstsq) and scipy
 * 1.17.1 (least_squares of each law on [A], a common k and [A]_0 per run; SEs from the Jacobian; the
 * Durbin-Watson p by its normal approximation, display only), by fading-refit.py beside this file;
 * values written here to 10 figures.
 */
export const FADING_REFIT = {"order":1,"orderReason":"the order-1 law alone leaves residuals without a pattern, and the smallest residual sum","k":{"value":0.04539393027,"standardError":0.0001858281906,"ci95":[0.0450049874,0.04578287315],"unit":"min^-1"},"byOrder":[{"order":0,"linear":{"k":{"value":4.557291667e-07,"standardError":4.422819517e-08,"ci95":[3.631584903e-07,5.48299843e-07],"unit":"M min^-1"},"intercepts":[2.336079545e-05,1.626231061e-05],"residualSS":1.308261916e-10,"dof":19,"readingsLeftOut":0},"nonlinear":{"k":{"value":4.557291667e-07,"standardError":4.422819517e-08,"ci95":[3.631584903e-07,5.48299843e-07],"unit":"M min^-1"},"initialConcentrations":[2.336079545e-05,1.626231061e-05],"residualSS":1.308261916e-10,"residualSDSignal":0.06297697422,"dof":19,"durbinWatson":0.2285322465,"patternP":1.630282279e-05,"residuals":[[-6.805871212e-06,-3.545454545e-06,-1.076704545e-06,4.337121212e-07,1.527462121e-06,2.079545455e-06,2.173295455e-06,2.267045455e-06,1.569128788e-06,1.162878788e-06,2.149621212e-07],[1.137310606e-06,1.814393939e-06,2.241477273e-06,1.835227273e-06,1.637310606e-06,1.147727273e-06,2.414772727e-07,-6.647727273e-07,-1.946022727e-06,-2.935606061e-06,-4.508522727e-06]]}},{"order":1,"linear":{"k":{"value":0.04539351983,"standardError":0.000324099649,"ci95":[0.04471517147,0.04607186819],"unit":"min^-1"},"intercepts":[-10.41028939,-11.10140402],"residualSS":0.007025114155,"dof":19,"readingsLeftOut":0},"nonlinear":{"k":{"value":0.04539393027,"standardError":0.0001858281906,"ci95":[0.0450049874,0.04578287315],"unit":"min^-1"},"initialConcentrations":[3.00971068e-05,1.511379481e-05],"residualSS":1.991052852e-13,"residualSDSignal":0.002456834123,"dof":19,"durbinWatson":2.978403777,"patternP":0.9891208307,"residuals":[[-6.955986945e-08,1.630222261e-08,1.403022859e-07,-2.011178609e-09,1.612213286e-08,-2.612452651e-08,-1.253330271e-07,1.101842731e-07,-1.668188064e-07,8.064024904e-08,-1.942639537e-08],[-1.120518524e-08,-2.077381063e-08,1.363586482e-07,-1.923322341e-07,-2.288205458e-08,9.65880901e-08,9.47366041e-10,7.339512659e-08,-8.897886473e-08,1.572161748e-07,-8.243079667e-08]]}},{"order":2,"linear":{"k":{"value":6155.32217,"standardError":595.755919,"ci95":[4908.390702,7402.253639],"unit":"M^-1 min^-1"},"intercepts":[-26588.95259,69675.58696],"residualSS":23737391690.0,"dof":19,"readingsLeftOut":0},"nonlinear":{"k":{"value":2918.476244,"standardError":259.433058,"ci95":[2375.476613,3461.475875],"unit":"M^-1 min^-1"},"initialConcentrations":[3.240570978e-05,1.313032371e-05],"residualSS":6.452678215e-11,"residualSDSignal":0.04422872758,"dof":19,"durbinWatson":0.3237040124,"patternP":4.225046295e-05,"residuals":[[2.23904311e-06,-1.571991744e-06,-2.34371815e-06,-2.279329072e-06,-1.647488292e-06,-9.594580054e-07,-3.394122541e-07,5.495472387e-07,8.399564588e-07,1.565390992e-06,1.85850165e-06],[-1.994676289e-06,-1.239821017e-06,-3.254955978e-07,3.598499076e-08,8.063299696e-07,1.433335459e-06,1.756470917e-06,2.167381422e-06,2.272936523e-06,2.726344055e-06,2.642403211e-06]]}}],"runs":[{"label":"A","times":[0.0,4.0,8.0,12.0,16.0,20.0,24.0,28.0,32.0,36.0,40.0],"concentrations":[3.016666667e-05,2.508333333e-05,2.079166667e-05,1.745833333e-05,1.454166667e-05,1.216666667e-05,1.025e-05,8.333333333e-06,7.208333333e-06,5.791666667e-06,4.916666667e-06],"initialConcentration":3.016666667e-05,"fractionReacted":0.8370165746,"halfLife":{"value":15.2696005,"standardError":0.06250884679,"ci95":[15.14708316,15.39211784],"unit":"min"}},{"label":"B","times":[0.0,4.0,8.0,12.0,16.0,20.0,24.0,28.0,32.0,36.0,40.0],"concentrations":[1.5125e-05,1.2625e-05,1.0375e-05,8.958333333e-06,7.333333333e-06,6e-06,5.083333333e-06,4.166666667e-06,3.625e-06,2.791666667e-06,2.541666667e-06],"initialConcentration":1.5125e-05,"fractionReacted":0.8319559229,"halfLife":{"value":15.2696005,"standardError":0.06250884679,"ci95":[15.14708316,15.39211784],"unit":"min"}}],"gradedOrder":1,"orderVerdict":"supported"} as unknown as Refit;

/** The readings (t in min, absorbance) the refit was made from. */
export const FADING_READINGS = [[[0.0,0.744],[4.0,0.622],[8.0,0.519],[12.0,0.439],[16.0,0.369],[20.0,0.312],[24.0,0.266],[28.0,0.22],[32.0,0.193],[36.0,0.159],[40.0,0.138]],[[0.0,0.383],[4.0,0.323],[8.0,0.269],[12.0,0.235],[16.0,0.196],[20.0,0.164],[24.0,0.142],[28.0,0.12],[32.0,0.107],[36.0,0.087],[40.0,0.081]]] as Array<Array<[number, number]>>;

export const FADING_SETTINGS = Settings.parse({
  kind: 'reaction-order',
  signal: { type: 'absorbance', molarAbsorptivity: { value: 2.4e4, unit: 'M^-1 cm^-1' }, pathLength: { value: 1, unit: 'cm' }, endAbsorbance: 0.02 },
});

/** A student's work on the readings: the order and k they report, and a half-life per run. */
export function fadingSubmission(studentId: string, reported: { order: 0 | 1 | 2; k: { value: string; uncertainty?: string; unit: string }; halfLives: Array<{ value: string; unit: string } | undefined> }): Submission {
  return Submission.parse({
    studentId,
    runs: FADING_READINGS.map((readings, r) => ({ label: ['A', 'B'][r], timeUnit: 'min', readings, ...(reported.halfLives[r] && { reported: { halfLife: reported.halfLives[r] } }) })),
    reported: { order: reported.order, k: reported.k },
  });
}

/** A checked result with these findings and the hand-made refit; the score is the rubric's 8 less what the findings cost. */
export function fadingResult(studentId: string, findings: CheckResult['findings'], refit: Refit = FADING_REFIT): KindResult<Refit> {
  const lost = findings.reduce((sum, f) => sum + f.pointsLost, 0);
  return {
    studentId,
    status: 'checked',
    score: 8 - lost,
    maxScore: 8,
    items: [
      { item: 'order', count: 1, each: 2 },
      { item: 'k', count: 1, each: 2 },
      { item: 'kUncertainty', count: 1, each: 1 },
      { item: 'halfLife', count: 2, each: 1 },
      { item: 'kUnit', count: 1, each: 1 },
    ],
    refit,
    findings,
    engineVersion: 'test',
  };
}
