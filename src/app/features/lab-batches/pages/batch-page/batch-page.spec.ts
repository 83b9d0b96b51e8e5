import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import type { BatchDetail, ImportReport } from '../../lab-batches.store';
import BatchPage from './batch-page';

const LAB_USER: SessionUser = {
  id: 'u-lab', organizationId: 'o1', email: 'lab@kestrel.test', name: 'Lab desk', role: 'lab', labName: 'Kestrel Analytical',
  siteIds: [], sites: [], deviceId: null, deviceName: null,
};

const BATCH: BatchDetail = {
  id: 'b1', siteId: 's1', code: 'JR-LB001', labName: 'Kestrel Analytical', labContactEmail: 'assays@kestrel.lab.test', method: 'Fire assay, AAS finish',
  chargeMassG: 30, detectionLimitGpt: 0.005, upperLimitGpt: 100, isBlind: true, status: 'reported', dispatchedBy: 'Neema', dispatchedAt: '2026-03-02T09:30:00.000Z',
  carrier: 'Bus', sealNumbers: 'S-1', receivedBy: null, receivedAt: null, conditionOnReceipt: null, sentAt: null, createdAt: '2026-03-01T08:00:00.000Z', itemCount: 2,
  items: [
    { id: 'i1', position: 1, labCode: 'JR-LB001-001', itemType: 'routine', isInserted: false, sampleId: 'x1', sampleCode: 'JR-88-A', standardCode: null, material: null, massKg: 2,
      assay: { valueGpt: 1.25, isBelowDetection: false, isAboveRange: false, detectionLimitGpt: 0.005, rawValue: '1.25' } },
    { id: 'i2', position: 2, labCode: 'JR-LB001-002', itemType: 'blank', isInserted: true, sampleId: null, sampleCode: null, standardCode: null, material: null, massKg: null,
      assay: { valueGpt: 0.005, isBelowDetection: true, isAboveRange: false, detectionLimitGpt: 0.005, rawValue: '<0.005' } },
  ],
  imports: [],
  qaqc: {
    blanks: [{ itemId: 'i2', batchCode: 'JR-LB001', labCode: 'JR-LB001-002', position: 2, valueGpt: 0.005, isBelowDetection: true, limitGpt: 0.025, verdict: 'pass' }],
    standards: [], duplicates: [],
    batches: [{ batchId: 'b1', batchCode: 'JR-LB001', verdict: 'pass', reasons: [] }],
  },
};

describe('BatchPage', () => {
  async function render() {
    TestBed.configureTestingModule({ imports: [BatchPage], providers: [provideHttpClient(), provideHttpClientTesting()] });
    TestBed.inject(AuthSession).user.set(LAB_USER);
    const fixture = TestBed.createComponent(BatchPage);
    fixture.componentRef.setInput('id', 'b1');
    fixture.autoDetectChanges();
    const server = TestBed.inject(HttpTestingController);
    server.expectOne('/api/lab-batches/b1').flush(BATCH);
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    return { fixture, element: fixture.nativeElement as HTMLElement, server };
  }

  const text = (element: HTMLElement, selector: string) => element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const cells = (element: HTMLElement) => [...element.querySelectorAll('[data-testid=assay]')].map((cell) => cell.textContent?.trim());

  afterEach(() => localStorage.clear());

  it('shows the batch to the lab in English, with assays below detection written as "< limit"', async () => {
    const { element } = await render();
    expect(text(element, 'h1')).toBe('science Batch JR-LB001');
    expect(text(element, '[data-testid=batch-status]')).toContain('Results in · 2 bags · Kestrel Analytical · Fire assay, AAS finish, 30 g, detection limit 0.005 g/t');
    expect(text(element, '.hs-muted')).toContain('Dispatched by Neema ·');
    expect(cells(element)).toEqual(['1.250', '< 0.005']);
    expect(text(element, '[data-testid=batch-verdict]')).toContain('Batch verdict: Pass');
    expect(element.textContent).toContain('Blank (inserted)');
  });

  it('switches the page to Kiswahili and to French, with French decimal commas', async () => {
    const { fixture, element } = await render();

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(text(element, 'h1')).toContain('Kundi JR-LB001');
    expect(text(element, '[data-testid=batch-status]')).toContain('Matokeo yamefika · mifuko 2');
    expect(text(element, '[data-testid=batch-verdict]')).toContain('Uamuzi wa kundi: Imefaulu');
    expect(element.textContent).toContain('Mnyororo wa ulinzi wa sampuli');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(text(element, 'h1')).toContain('Lot JR-LB001');
    expect(text(element, '[data-testid=batch-status]')).toContain('limite de détection 0,005 g/t');
    expect(cells(element)).toEqual(['1,250', '< 0,005']);
    expect(text(element, '[data-testid=batch-verdict]')).toContain('Verdict du lot : Réussi');
    expect(element.textContent).toContain('Blanc (inséré)');
  });

  it('reports a results file in French: row counts, row status in words, the server’s detail as sent', async () => {
    const { fixture, element, server } = await render();
    await TestBed.inject(AppLanguage).use('fr');
    const report: ImportReport = {
      fileName: 'r.csv', fileProblems: [], notInFile: ['JR-LB001-002'], summary: { rows: 1, blocking: 1, changed: 0 }, canSave: false, isAlreadyImported: false, isSaved: false,
      rows: [{ line: 2, sampleCode: 'JR-LB001-001', rawValue: '1,2x', status: 'not-a-number', message: '"1,2x" is not a number.', isBlocking: true, valueGpt: null, isBelowDetection: false, change: null }],
      qaqc: { blanks: [], standards: [], duplicates: [], batches: [] },
    };
    const input = element.querySelector('[data-testid=results-file]') as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [new File(['x'], 'r.csv', { type: 'text/csv' })] });
    input.dispatchEvent(new Event('change'));
    server.expectOne((request) => request.url === '/api/lab-batches/b1/results' && request.params.get('dryRun') === 'true').flush(report);
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    expect(text(element, '[data-testid=import-report] p')).toBe('1 lignes · 1 avec problème · 0 à enregistrer · absents du fichier : JR-LB001-002');
    expect(text(element, 'tr.blocking')).toContain('Pas un nombre');
    expect(text(element, 'tr.blocking')).toContain('"1,2x" is not a number.');
  });

  it('explains a refusal in the reader’s language by its code', async () => {
    const { fixture, element, server } = await render();
    await TestBed.inject(AppLanguage).use('sw');
    (element.querySelector('button[type=submit]') as HTMLButtonElement).click();
    server.expectOne('/api/lab-batches/b1/custody').flush({ error: { code: 'forbidden', message: 'Not allowed', details: null } }, { status: 403, statusText: 'Forbidden' });
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    expect(text(element, '[role=alert]')).toContain('Akaunti yako hairuhusiwi kufanya hivi kwa kundi hili.');
  });
});
