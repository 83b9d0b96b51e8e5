import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import { AppLanguage } from '../../../../i18n/app-language';
import type { ChartWords } from '../../qaqc-charts';
import type { SiteQaqc } from '../../qaqc.store';
import { flaggedReasons } from './qaqc-page';

const DATA: SiteQaqc = {
  blanks: [
    { itemId: 'b1', batchCode: 'JR-LB001', labCode: 'JR-LB001-003', valueGpt: 0.2, isBelowDetection: false, limitGpt: 0.025, verdict: 'fail' },
    { itemId: 'b2', batchCode: 'JR-LB002', labCode: 'JR-LB002-003', valueGpt: 0.005, isBelowDetection: true, limitGpt: 0.025, verdict: 'pass' },
  ],
  standards: [{ itemId: 's1', batchCode: 'JR-LB001', labCode: 'JR-LB001-007', standardCode: 'OREAS-X', valueGpt: 2.9, expectedGpt: 2.5, sdGpt: 0.15, zScore: 2.4, verdict: 'warn' }],
  duplicates: [{ itemId: 'd1', batchCode: 'JR-LB001', labCode: 'JR-LB001-010', originalLabCode: 'JR-LB001-009', originalGpt: 1, duplicateGpt: 2, hard: 0.33, tolerance: 0.3, verdict: 'fail' }],
  batches: [],
  standardsOnRecord: [],
};

function chartWords(): ChartWords {
  const transloco = TestBed.inject(TranslocoService);
  return { translate: (key, params) => transloco.translate(key, params), locale: TestBed.inject(AppLanguage).locale() };
}

describe('flaggedReasons', () => {
  it('lists the flagged checks of each batch as the server words them, and leaves a clean batch out', () => {
    const reasons = flaggedReasons(DATA, chartWords());
    expect(reasons.get('JR-LB001')).toBe('blank JR-LB001-003: fail; standard OREAS-X (JR-LB001-007): warn; duplicate JR-LB001-010 of JR-LB001-009: fail');
    expect(reasons.has('JR-LB002')).toBe(false);
  });

  it('words them in Kiswahili and in French', async () => {
    await TestBed.inject(AppLanguage).use('sw');
    expect(flaggedReasons(DATA, chartWords()).get('JR-LB001')).toBe('sampuli tupu JR-LB001-003: imeshindwa; sampuli rejea OREAS-X (JR-LB001-007): tahadhari; pacha JR-LB001-010 ya JR-LB001-009: imeshindwa');
    await TestBed.inject(AppLanguage).use('fr');
    expect(flaggedReasons(DATA, chartWords()).get('JR-LB001')).toBe('blanc JR-LB001-003 : échec ; étalon OREAS-X (JR-LB001-007) : alerte ; duplicata JR-LB001-010 de JR-LB001-009 : échec');
  });
});
