import type { Settings } from '../schemas.ts';
import type { Rejection } from '../../../schemas/result.ts';
import { unitIssues } from '../../../server/checks/unit-issues.ts';

/** Every unit in the settings must parse, and be of the kind its place needs. */
export function settingsIssues(settings: Settings): Rejection[] {
  return unitIssues([
    ['units.Ea', settings.units.Ea, 'molar-energy'],
    ['units.A', settings.units.A, 'first-order-rate'],
    ['units.dH', settings.units.dH, 'molar-energy'],
    ['units.dS', settings.units.dS, 'molar-entropy'],
    ['reference.Ea.unit', settings.reference?.Ea?.unit, 'molar-energy'],
    ['reference.A.unit', settings.reference?.A?.unit, 'first-order-rate'],
    ['reference.dH.unit', settings.reference?.dH?.unit, 'molar-energy'],
    ['reference.dS.unit', settings.reference?.dS?.unit, 'molar-entropy'],
  ]);
}
