import { KIND, Settings } from '../schemas.ts';
import type { KindDescription } from '../../../schemas/api/kinds.ts';
import { settingsForm } from '../../../reports/display/settings-form.ts';

/** `first-order-catalysis` as the workspace shows it: its quantities, settings form, upload and signals. */
export const firstOrderCatalysisDescription: KindDescription = {
  kind: KIND,
  title: 'First-order runs and the catalysis rate law',
  quantities: [
    { id: 'k', label: 'rate constant of a run', symbol: 'k_{obs}', unit: 'min^-1' },
    { id: 'kN', label: 'uncatalysed rate constant', symbol: 'k_{N}', unit: 'min^-1' },
    { id: 'kA', label: 'catalytic rate constant', symbol: 'k_{A}', unit: 'M^-1 min^-1' },
  ],
  settings: {
    form: settingsForm(Settings, {
      groups: [
        { label: 'Fits', keys: ['fitModel', 'rateLawFit', 'weightedErrors'] },
        { label: 'Units values are reported in', keys: ['units'] },
        { label: 'Tolerances', keys: ['tolerances'] },
        { label: 'The instrument (for signals to review, never points)', keys: ['displayStep', 'instrumentNoise', 'temperature'] },
        { label: 'Rubric points', keys: ['rubric'] },
      ],
      kept: ['classDataset', 'reference', 'equilibrium'],
      words: {
        fitModel: { label: 'ln F against t', options: { origin: 'ln F = -k t (through the origin)', intercept: 'ln F = a - k t (with an intercept)' } },
        rateLawFit: { label: 'k_{obs} against [catalyst]', options: { ordinary: 'ordinary least squares', weighted: 'weighted by 1/SE² of each k_{obs}' } },
        weightedErrors: { label: 'Right SEs of a weighted fit', options: { either: 'either convention', absolute: 'SEs of k_{obs} taken as absolute', scaled: 'scaled by the scatter about the line' } },
        'units.k': 'k_{obs}',
        'units.kN': 'k_{N}',
        'units.kA': 'k_{A}',
        'tolerances.reading': { label: 'Readings', unit: 'reading unit' },
        'tolerances.lnF': 'ln F entries',
        'tolerances.k': 'k_{obs}',
        'tolerances.kUncertainty': 'SE of k_{obs}',
        'tolerances.kN': 'k_{N}',
        'tolerances.kA': 'k_{A}',
        'tolerances.rateLawUncertainty': 'SEs of k_{N} and k_{A}',
        displayStep: 'Display step of a reading',
        instrumentNoise: { label: 'Stated noise of one reading (SD)', help: 'optional: leave empty to compare with the section alone' },
        'temperature.maxSpread': { label: 'Largest spread of run temperatures', unit: '°C' },
        'temperature.required': 'Each run records its temperature',
        'rubric.readings': 'Readings, per run (with a class dataset)',
        'rubric.lnF': 'ln F column, per run',
        'rubric.k': 'k_{obs}, per run',
        'rubric.kUncertainty': 'SE of k_{obs}, per run',
        'rubric.kN': 'k_{N}',
        'rubric.kNUncertainty': 'SE of k_{N}',
        'rubric.kA': 'k_{A}',
        'rubric.kAUncertainty': 'SE of k_{A}',
        'rubric.sigFigs': 'Rounding, once',
      },
    }),
    note: 'A class dataset, reference bands and the equilibrium block, where set, are kept as they are (the API edits them).',
  },
  upload: {
    json: true,
    csv: [
      { name: 'readings', required: true, columns: ['student_id', 'run', 'catalyst', 'catalyst_unit', 'time_unit', 't', 'x'], optionalColumns: ['infinity', 'lnf', 'temperature_c'] },
      { name: 'reported', required: false, columns: ['student_id', 'run', 'quantity', 'value', 'unit'], optionalColumns: ['uncertainty'] },
    ],
  },
  signals: {
    unit: 'run',
    reportedValue: 'reported k',
    codes: [
      { code: 'small-change', label: 'The readings change little over the run' },
      { code: 'over-resolution', label: 'Readings with more decimals than the instrument shows' },
      { code: 'residual-pattern', label: 'Residuals in a pattern, not scatter' },
      { code: 'end-value', label: 'The end value and the fitted one disagree' },
      { code: 'temperature-spread', label: 'Run temperatures spread wide' },
      { code: 'temperature-missing', label: 'A run’s temperature is missing' },
      { code: 'digit-preference', label: 'Last digits not evenly used' },
      { code: 'constant-apart', label: 'A run’s K stands apart from the others' },
    ],
  },
};
