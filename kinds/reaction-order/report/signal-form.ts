import type { FormGroup } from '../../../schemas/api/kinds.ts';

/**
 * The settings form's fields for the signal, one fieldset for the three types. The form is made from
 * the settings schema elsewhere, but a choice of shapes (the signal's union) has no single control:
 * its fields are listed here, each by its path in one of the shapes. The page sends every field; the
 * schema keeps those of the type chosen and drops the rest, so only the chosen type's need filling.
 */
export const SIGNAL_TYPES = { concentration: 'Concentration of the reactant', absorbance: 'Absorbance, by the Beer-Lambert law', conductance: 'Conductance, by a linear calibration' } as const;

export const signalFormGroup: FormGroup = {
  type: 'group',
  label: 'The signal measured',
  help: 'Fill in the fields of the type chosen; the others are ignored. Absorbance: [A] = (A − A∞) / (ε l). Conductance: [A] = (G − intercept) / slope.',
  fields: [
    { name: 'signal.type', label: 'Readings are', type: 'select', default: 'concentration', options: Object.entries(SIGNAL_TYPES).map(([value, label]) => ({ value, label })) },
    { name: 'signal.unit', label: 'Unit of the readings', help: 'concentration or conductance: M, mM, mS, µS', type: 'text', default: 'M' },
    { name: 'signal.molarAbsorptivity.value', label: 'Molar absorptivity ε', help: 'absorbance only', type: 'number', min: 0, minExclusive: true, optional: true },
    { name: 'signal.molarAbsorptivity.unit', label: 'Unit of ε', type: 'text', default: 'M^-1 cm^-1' },
    { name: 'signal.pathLength.value', label: 'Path length l', type: 'number', default: 1, min: 0, minExclusive: true, optional: false },
    { name: 'signal.pathLength.unit', label: 'Unit of l', type: 'text', default: 'cm' },
    { name: 'signal.endAbsorbance', label: 'End absorbance A_{∞}', help: '0 where the products do not absorb', type: 'number', default: 0, optional: false },
    { name: 'signal.calibration.slope.value', label: 'Calibration slope', help: 'conductance only', type: 'number', optional: true },
    { name: 'signal.calibration.slope.unit', label: 'Unit of the slope', type: 'text', default: 'mS M^-1' },
    { name: 'signal.calibration.intercept.value', label: 'Calibration intercept', type: 'number', default: 0, optional: false },
    { name: 'signal.calibration.intercept.unit', label: 'Unit of the intercept', help: 'the readings’ unit', type: 'text', default: 'mS' },
  ],
};
