import { TestBed } from '@angular/core/testing';
import { AppLanguage } from '../../../../i18n/app-language';
import { SiteMapStore } from '../../site-map.store';
import { SiteImageForm } from './site-image-form';

const stored = { west: 33.451, south: -4.052, east: 33.4525, north: -4.0505, url: '/api/sites/s1/image?v=1' };

async function render() {
  const uploadImage = jest.fn(async () => stored);
  TestBed.configureTestingModule({ providers: [{ provide: SiteMapStore, useValue: { uploadImage } }] });
  const fixture = TestBed.createComponent(SiteImageForm);
  fixture.componentRef.setInput('siteId', 's1');
  fixture.componentRef.setInput('current', stored);
  fixture.autoDetectChanges();
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const type = (field: string, value: string) => {
    const input = element.querySelector<HTMLInputElement>(`#corner-${field}`)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  const send = async () => {
    element.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
  };
  return { fixture, element, type, send, uploadImage };
}

describe('SiteImageForm', () => {
  it('refuses corners the wrong way round in words, and sends nothing', async () => {
    const { element, type, send, uploadImage } = await render();
    for (const [field, value] of Object.entries({ north: '-4.0520', south: '-4.0505', west: '33.4510', east: '33,45' })) type(field, value);
    await send();
    expect(element.querySelector('#corner-north-error')?.textContent).toContain('The north edge must be greater than the south edge (south latitudes are negative)');
    expect(element.querySelector('#corner-east-error')?.textContent).toContain('Longitude in decimal degrees, with a point, e.g. 33.4518');
    expect(uploadImage).not.toHaveBeenCalled();
  });

  it('speaks Kiswahili and French after a switch, figures in the French way', async () => {
    const { fixture, element, type, send } = await render();
    type('west', '-181');
    await send();
    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    expect(element.querySelector('h2')?.textContent).toContain('Picha ya eneo (msimamizi)');
    expect(element.querySelector('#corner-west-error')?.textContent).toContain('Longitudo lazima iwe kati ya -180° na 180°');

    await TestBed.inject(AppLanguage).use('fr');
    await fixture.whenStable();
    expect(element.querySelector('[data-testid="site-image-send"]')?.textContent).toContain('Enregistrer l’image du site');
    expect(element.querySelector('#corner-west-error')?.textContent).toContain('La longitude doit être entre -180° et 180°');
    // CLDR fr: a decimal comma.
    expect(element.textContent).toContain('Enregistré\u00a0: 33,45100 à 33,45250 E, -4,05200 à -4,05050 N.');
  });
});
