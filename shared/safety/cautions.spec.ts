import { CAUTIONS, HAZARDS, PLANNING_ESTIMATE_STATEMENT, cautionFor } from './cautions';

describe('safety cautions', () => {
  it('has exactly one caution for every hazard a crew can record', () => {
    expect(CAUTIONS.map((caution) => caution.hazard).sort()).toEqual([...HAZARDS].sort());
  });

  it('names a source, or says there is none, beside every caution', () => {
    for (const caution of CAUTIONS) {
      expect(caution.source.length).toBeGreaterThan(10);
      expect(caution.actions.length).toBeGreaterThan(0);
    }
  });

  // Minamata Convention Annex C lists open burning of amalgam among the worst practices.
  it('warns never to heat amalgam in the open', () => {
    expect(cautionFor('mercury').actions.join(' ')).toMatch(/never heat amalgam/i);
  });

  it('defers to local law and licensed practice', () => {
    expect(PLANNING_ESTIMATE_STATEMENT).toMatch(/not a resource statement/);
    expect(PLANNING_ESTIMATE_STATEMENT).toMatch(/law/);
  });

  it('refuses a hazard it does not know', () => {
    expect(() => cautionFor('lava' as never)).toThrow(/No caution/);
  });
});
