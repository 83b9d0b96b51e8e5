import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { StorageFullError } from '../../../../core/db/storage-full';
import { AppLanguage } from '../../../../i18n/app-language';
import { CaptureStore } from '../../capture.store';
import SampleForm from './sample-form';

const SITE = { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6a01', code: 'JR', name: 'Camp' };
const PILE = { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b02', code: 'JR-03-P0001', siteId: SITE.id, deletedAt: null };

async function render(language: 'en' | 'fr', { isCodeTaken = false } = {}) {
  const store = {
    livePiles: signal([PILE]), samples: signal([]), sites: () => [SITE], isSampleCodeTaken: jest.fn(async () => isCodeTaken),
    saveSample: jest.fn(async () => undefined), nextCode: jest.fn(async () => 'JR-03-0001'), deviceId: async () => 'spec', userId: () => '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01',
  };
  TestBed.configureTestingModule({ imports: [SampleForm], providers: [provideRouter([]), { provide: CaptureStore, useValue: store }] });
  await TestBed.inject(AppLanguage).use(language);
  jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
  const fixture = TestBed.createComponent(SampleForm);
  fixture.detectChanges();
  await fixture.whenStable();
  const page = fixture.nativeElement as HTMLElement;
  const form = (fixture.componentInstance as unknown as { form: { patchValue(value: object): void } }).form;
  const submit = async () => {
    page.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve, 0));
    fixture.detectChanges();
  };
  return { page, form, submit, store };
}

describe('SampleForm', () => {
  it('refuses a label code already used on this phone, in the crew language, and saves nothing', async () => {
    const { page, form, submit, store } = await render('fr', { isCodeTaken: true });
    expect(page.querySelector('h1')!.textContent).toBe('Nouvel échantillon');
    expect(page.textContent).toContain('Masse humide (kg)');

    form.patchValue({ pileId: PILE.id, labelCode: 'jr-03-0042', wetMassKg: 10.5 });
    await submit();

    expect(page.querySelector('[data-testid="label-problem"]')!.textContent).toBe(
      'JR-03-0042 est déjà utilisé par un échantillon sur ce téléphone : prenez une nouvelle étiquette');
    expect(store.saveSample).not.toHaveBeenCalled();
  });

  it('refuses a label of another site', async () => {
    const { page, form, submit, store } = await render('en');

    form.patchValue({ pileId: PILE.id, labelCode: 'NH-07-0042' });
    await submit();

    expect(page.querySelector('[data-testid="label-problem"]')!.textContent).toBe('NH-07-0042 is a label of site NH, but this pile is at JR');
    expect(store.saveSample).not.toHaveBeenCalled();
  });

  it('saves a sample with this phone\'s next code when the label is left empty', async () => {
    const { page, form, submit, store } = await render('en');

    form.patchValue({ pileId: PILE.id, wetMassKg: 10.5, moisturePct: 8 });
    await submit();

    expect(page.querySelectorAll('[role="alert"]')).toHaveLength(0);
    expect(store.saveSample).toHaveBeenCalledWith(expect.objectContaining({ code: 'JR-03-0001', pileId: PILE.id, wetMassKg: 10.5 }), []);
  });

  it('stays open with what was typed when the phone is full (the store has shown the notice), and goes nowhere', async () => {
    const { form, submit, store } = await render('en');
    store.saveSample.mockRejectedValueOnce(new StorageFullError(new DOMException('full', 'QuotaExceededError')));
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigateByUrl');

    form.patchValue({ pileId: PILE.id, wetMassKg: 10.5 });
    await submit();

    expect(store.saveSample).toHaveBeenCalledTimes(1);
    expect(navigate).not.toHaveBeenCalled();
    expect((form as unknown as { getRawValue(): { wetMassKg: number } }).getRawValue().wetMassKg).toBe(10.5);
  });
});
