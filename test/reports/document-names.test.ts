import { describe, expect, it } from 'vitest';
import { documentName } from '../../reports/file-names.ts';
import { attachment } from '../../server/http/download-header.ts';

// Expected names worked by hand from the rule: letters, digits, '.', '_' and '-' kept; any other run
// of characters one '_'; parts joined by '-'. Header syntax: RFC 6266 §4.1 and RFC 5987 (ext-value).
describe('documentName', () => {
  it('names a download by course, section, assignment and what it is', () => {
    expect(documentName(['Kinetics lab', 'Section 2', 'Lab 3: rates (HCl)'], 'gradebook', '.csv')).toEqual({
      ascii: 'Kinetics_lab-Section_2-Lab_3_rates_HCl-gradebook.csv',
      unicode: 'Kinetics_lab-Section_2-Lab_3_rates_HCl-gradebook.csv',
    });
  });

  it('leaves no path, quote or control character in either name', () => {
    const name = documentName(['../../etc', 'a"b\\c', 'x\r\ny;z'], 'summary', '.pdf');
    expect(name.ascii).toBe('etc-a_b_c-x_y_z-summary.pdf');
    expect(name.unicode).toBe(name.ascii);
  });

  it('takes accents off for the plain name and keeps them in the full one', () => {
    expect(documentName(['Chimie générale', 'Groupe B', 'Cinétique'], 'feedback', '.zip')).toEqual({
      ascii: 'Chimie_generale-Groupe_B-Cinetique-feedback.zip',
      unicode: 'Chimie_générale-Groupe_B-Cinétique-feedback.zip',
    });
  });

  it('names a part made only of other characters "unnamed" and cuts a long one to 60 characters', () => {
    const name = documentName(['***', 'x'.repeat(80), 'A'], 'gradebook', '.csv');
    expect(name.ascii).toBe(`unnamed-${'x'.repeat(60)}-A-gradebook.csv`);
  });

  it('cuts a long title after its last whole word within 60 characters', () => {
    // By hand: 57 characters up to "temperatures", then "_invented_scenario" runs past 60.
    const name = documentName(['C', 'S', 'Activation energy from rate constants at six temperatures (invented scenario)'], 'summary', '.pdf');
    expect(name.ascii).toBe('C-S-Activation_energy_from_rate_constants_at_six_temperatures-summary.pdf');
    // Cut just before the limit: 60 characters ending a word are kept whole.
    expect(documentName([`${'a'.repeat(29)} ${'b'.repeat(30)} c`], 'x', '.pdf').ascii).toBe(`${'a'.repeat(29)}_${'b'.repeat(30)}-x.pdf`);
  });
});

describe('attachment', () => {
  it('sends filename= alone when the name is plain ASCII', () => {
    expect(attachment(documentName(['C', 'S', 'A'], 'gradebook', '.csv'))).toEqual({ 'content-disposition': 'attachment; filename="C-S-A-gradebook.csv"' });
  });

  it("adds filename*=UTF-8'' with the name percent-encoded when it has other letters", () => {
    // é is C3 A9 in UTF-8.
    expect(attachment(documentName(['Cinétique'], 'summary', '.pdf'))).toEqual({
      'content-disposition': `attachment; filename="Cinetique-summary.pdf"; filename*=UTF-8''Cin%C3%A9tique-summary.pdf`,
    });
  });
});
