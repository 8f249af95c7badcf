import { findingCodes, KIND, Settings } from '../schemas.ts';
import type { KindDescription } from '../../../schemas/api/kinds.ts';
import { settingsForm } from '../../../reports/display/settings-form.ts';
import { READINGS_COLUMNS, REPORTED_COLUMNS } from '../csv.ts';
import { findingWords } from '../../../reports/labels.ts';
import { signalFormGroup } from './signal-form.ts';

/** `reaction-order` as the workspace shows it: its quantities, settings form, upload and signals. */
export const reactionOrderDescription: KindDescription = {
  kind: KIND,
  title: 'Order of a reaction and its k from the integrated rate laws',
  quantities: [
    { id: 'order', label: 'order in the reactant', symbol: 'n', unit: '' },
    { id: 'k', label: 'rate constant, −d[A]/dt = k[A]^n (its unit by the order)', symbol: 'k', unit: 'min^-1' },
    { id: 'halfLife', label: 'half-life of a run', symbol: 't_{1/2}', unit: 'min' },
  ],
  settings: {
    form: [
      signalFormGroup,
      ...settingsForm(Settings, {
        groups: [
          { label: 'Units values are reported in', keys: ['units'] },
          { label: 'Tolerances', keys: ['tolerances'] },
          { label: 'Rubric points', keys: ['rubric'] },
        ],
        kept: ['signal'],
        words: {
          'units.time': { label: 'Time unit of k and t_{1/2}', options: { s: 's', min: 'min', h: 'h' } },
          'tolerances.k': 'k',
          'tolerances.kUncertainty': 'SE of k',
          'tolerances.halfLife': 't_{1/2}',
          'rubric.order': 'Order n',
          'rubric.k': 'k',
          'rubric.kUncertainty': 'SE of k',
          'rubric.kUnit': 'Unit of k fits the order',
          'rubric.halfLife': 't_{1/2}, per run',
          'rubric.sigFigs': { label: 'Significant figures', help: '0 makes a rounding slip a warning only' },
        },
      }),
    ],
  },
  upload: {
    json: true,
    csv: [
      { name: 'readings', required: true, columns: READINGS_COLUMNS, optionalColumns: ['initial_concentration', 'initial_concentration_unit'] },
      { name: 'reported', required: false, columns: REPORTED_COLUMNS, optionalColumns: ['uncertainty', 'run'] },
    ],
  },
  findings: findingWords(findingCodes, {
    'order-not-supported': 'Order the data do not support',
    'k-unit-order': 'Unit of k does not fit the order',
    'other-order-law': "k from another order's law",
    'path-length': 'Path length left out',
    transmittance: 'Transmittance used as absorbance',
    'absorptivity-unit': 'Absorptivity in other units',
    'end-absorbance': 'End absorbance ignored',
    'half-life-formula': "Another order's half-life",
    'stoichiometric-k': 'k per 2A → P (accepted)',
    'time-unit': 'Time unit of k mixed up',
    'concentration-unit': 'Concentration unit mixed up',
    'order-undetermined': 'Runs too short to tell the order',
  }),
  signals: { unit: 'run', reportedValue: 'reported k', codes: [] },
};
