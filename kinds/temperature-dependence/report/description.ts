import { findingCodes, KIND, Settings } from '../schemas.ts';
import type { KindDescription } from '../../../schemas/api/kinds.ts';
import { settingsForm } from '../../../reports/display/settings-form.ts';
import { findingWords } from '../../../reports/labels.ts';
import { SYMBOLS } from './symbols.ts';

/** `temperature-dependence` as the workspace shows it: its quantities, settings form, upload and signals. */
export const temperatureDependenceDescription: KindDescription = {
  kind: KIND,
  title: 'Rate constants at several temperatures (Arrhenius, Eyring)',
  quantities: [
    { id: 'Ea', label: 'activation energy', symbol: SYMBOLS.Ea, unit: 'kJ mol^-1' },
    { id: 'A', label: 'pre-exponential factor', symbol: SYMBOLS.A, unit: 's^-1' },
    { id: 'dH', label: 'enthalpy of activation', symbol: SYMBOLS.dH, unit: 'kJ mol^-1' },
    { id: 'dS', label: 'entropy of activation', symbol: SYMBOLS.dS, unit: 'J K^-1 mol^-1' },
  ],
  settings: {
    form: settingsForm(Settings, {
      groups: [
        { label: 'Fit', keys: ['fit'] },
        { label: 'Units values are reported in', keys: ['units'] },
        { label: 'Tolerances', keys: ['tolerances'] },
        { label: 'Rubric points', keys: ['rubric'] },
      ],
      kept: ['reference'],
      words: {
        fit: { label: 'ln k against 1/T', options: { ordinary: 'ordinary least squares', weighted: 'weighted by 1/SE² of each ln k' } },
        'units.Ea': SYMBOLS.Ea,
        'units.A': SYMBOLS.A,
        'units.dH': SYMBOLS.dH,
        'units.dS': SYMBOLS.dS,
        'tolerances.k': 'k of each run',
        'tolerances.Ea': SYMBOLS.Ea,
        'tolerances.A': SYMBOLS.A,
        'tolerances.dH': SYMBOLS.dH,
        'tolerances.dS': { label: SYMBOLS.dS, unit: 'J K^-1 mol^-1' },
        'tolerances.uncertainty': 'Standard errors',
        'rubric.k': 'k of each run given as readings',
        'rubric.Ea': SYMBOLS.Ea,
        'rubric.EaUncertainty': `SE of ${SYMBOLS.Ea}`,
        'rubric.A': SYMBOLS.A,
        'rubric.dH': SYMBOLS.dH,
        'rubric.dS': SYMBOLS.dS,
        'rubric.sigFigs': { label: 'Significant figures', help: '0 makes a rounding slip a warning only' },
      },
    }),
    note: 'Reference bands, where set, are kept as they are (the API edits them).',
  },
  upload: {
    json: true,
    csv: [
      { name: 'points', required: true, columns: ['student_id', 'label', 'temperature', 'temperature_unit'], optionalColumns: ['k', 'k_unit', 'k_uncertainty', 't', 'x', 'time_unit', 'infinity'] },
      { name: 'reported', required: false, columns: ['student_id', 'quantity', 'value', 'unit'], optionalColumns: ['uncertainty', 'label'] },
    ],
  },
  findings: findingWords(findingCodes, {
    'temperature-implausible': 'Temperature unlikely as declared',
    'run-not-fitted': 'Run gives no k',
    'time-unit-implausible': 'Time unit unlikely for the run',
    'uncertainty-undefined': 'Two temperatures: no SEs',
    'temperature-scale': '°C used in 1/T',
    'gas-constant': 'Gas constant in other units',
    'energy-unit': 'Energy unit mixed up',
    'reciprocal-scale': '1000/T read as 1/T',
    'eyring-form': 'Another form of the Eyring plot',
    'time-unit': 'Time unit of k mixed up',
  }),
  signals: { unit: 'run', reportedValue: 'reported k', codes: [] },
};
