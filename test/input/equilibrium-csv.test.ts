import { describe, expect, it } from 'vitest';
import { parseSubmissionsCsv } from '../../kinds/first-order-catalysis/csv.ts';

// Hand-written files: one run of three readings, and the equilibrium block's values as a student reports them.
const readings = ['student_id,run,catalyst,catalyst_unit,time_unit,t,x,infinity', 'E-1,r1,0.1,M,min,0,22.44,10.54', 'E-1,r1,0.1,M,min,1,21.84,', 'E-1,r1,0.1,M,min,2,21.27,'].join('\n');
const reported = [
  'student_id,run,quantity,value,uncertainty,unit',
  'E-1,r1,k,0.0518,0.0001,min^-1',
  'E-1,r1,alpha_eq,52.70,,deg mL g^-1 dm^-1',
  'E-1,r1,x_B,63.6,,%',
  'E-1,r1,k_eq,1.75,,',
  'E-1,r1,kf,0.0330,,min^-1',
  'E-1,r1,kr,0.0188,,min^-1',
  'E-1,,k_eq,1.75,,',
  'E-1,,kNf,0.0141,,min^-1',
  'E-1,,kAr,0.216,,M^-1 min^-1',
].join('\n');

describe('the reported CSV with the equilibrium block’s quantities', () => {
  it('files alpha_eq, x_B, k_eq, kf and kr under the run, and k_eq and the split of k_N, k_A under the submission', () => {
    const { submissions, rowErrors } = parseSubmissionsCsv(readings, reported);
    expect(rowErrors).toEqual([]);
    const s = submissions[0] as { runs: Array<{ reported: Record<string, { value: string; unit: string }> }>; reported: Record<string, { value: string }> };
    expect(Object.keys(s.runs[0].reported).sort()).toEqual(['K', 'k', 'kf', 'kr', 'specificRotation', 'xB']);
    expect(s.runs[0].reported.xB).toEqual({ value: '63.6', unit: '%' });
    expect(s.runs[0].reported.K.value).toBe('1.75');
    expect(Object.keys(s.reported).sort()).toEqual(['K', 'kAr', 'kNf']);
  });

  it('refuses kNf given to a run, naming the line', () => {
    const { rowErrors } = parseSubmissionsCsv(readings, `${reported}\nE-1,r1,kNf,0.0141,,min^-1`);
    expect(rowErrors.map((e) => e.message)).toContain('unknown quantity "kNf": use k, kN or kA (with the equilibrium block also alpha_eq, x_B, k_eq, kf, kr per run, and k_eq, kNf, kNr, kAf, kAr with run blank)');
  });
});
