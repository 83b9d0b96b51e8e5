import { Component, input, output, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { localPlane } from '../../../../../../shared/engine/geodesy';
import { AppLanguage } from '../../../../i18n/app-language';
import { CaptureStore } from '../../capture.store';
import { FootprintMap } from '../../components/footprint-map';
import PileForm from './pile-form';

const SITE = { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6a01', code: 'JR', name: 'Camp' };
const plane = localPlane({ lon: 33.45, lat: -4.05 });

/** [lon, lat] of a point given in metres east and north of the spec's origin. */
function lonLatAt(x: number, y: number): [number, number] {
  const { lon, lat } = plane.toLonLat({ x, y });
  return [lon, lat];
}

/** A 12 m square toe centred on the origin. */
const SQUARE_TOE = [lonLatAt(-6, -6), lonLatAt(6, -6), lonLatAt(6, 6), lonLatAt(-6, 6)];

/** Leaflet draws nothing in jsdom; the form only needs the map's inputs and output. */
@Component({ selector: 'hs-footprint-map', template: '' })
class MapStandIn {
  readonly center = input<[number, number]>([0, 0]);
  readonly corners = input<readonly [number, number][]>([]);
  readonly cornerAdded = output<[number, number]>();
}

/** The phone's GPS answers each `getCurrentPosition` with the next of these fixes. */
function fakeGps(fixes: { x: number; y: number; accuracyM: number }[]): void {
  const queue = [...fixes];
  Object.defineProperty(navigator, 'geolocation', {
    configurable: true,
    value: {
      getCurrentPosition: (success: PositionCallback) => {
        const fix = queue.shift()!;
        const [longitude, latitude] = lonLatAt(fix.x, fix.y);
        success({ coords: { longitude, latitude, accuracy: fix.accuracyM } } as GeolocationPosition);
      },
      watchPosition: () => 1,
      clearWatch: () => undefined,
    },
  });
}

async function render(language: 'en' | 'fr', draft: object | null) {
  const store = {
    sites: () => [SITE], draft: jest.fn(async () => draft), saveDraft: jest.fn(async () => undefined), clearDraft: jest.fn(async () => undefined),
    nextCode: jest.fn(async () => 'JR-03-P0001'), savePile: jest.fn(async () => undefined),
  };
  TestBed.configureTestingModule({ imports: [PileForm], providers: [provideRouter([]), { provide: CaptureStore, useValue: store }] });
  TestBed.overrideComponent(PileForm, { remove: { imports: [FootprintMap] }, add: { imports: [MapStandIn] } });
  await TestBed.inject(AppLanguage).use(language);
  jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
  const fixture = TestBed.createComponent(PileForm);
  fixture.detectChanges();
  await fixture.whenStable();
  fixture.detectChanges();
  const page = fixture.nativeElement as HTMLElement;
  const settle = async () => {
    fixture.detectChanges();
    await fixture.whenStable();
    fixture.detectChanges();
  };
  const takePoint = async (heightM: number) => {
    (page.querySelector('hs-spot-heights-editor button.add') as HTMLButtonElement).click();
    await settle();
    const field = page.querySelector('[data-testid="spot-height-input"]') as HTMLInputElement | null;
    if (field) {
      field.value = String(heightM);
      field.dispatchEvent(new Event('input'));
      [...page.querySelectorAll('hs-spot-heights-editor .pending button')].find((button) => button.textContent!.includes(language === 'fr' ? 'Garder' : 'Keep'))!
        .dispatchEvent(new Event('click'));
      await settle();
    }
  };
  const submit = async () => {
    page.querySelector('form')!.dispatchEvent(new Event('submit'));
    await settle();
    await new Promise((resolve) => setTimeout(resolve, 0));
    fixture.detectChanges();
  };
  const text = (testId: string) => page.querySelector(`[data-testid="${testId}"]`)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  return { page, store, takePoint, submit, text };
}

const SURVEYED_DRAFT = { form: { siteId: SITE.id, material: 'sluice-tailings', shapeModel: 'surveyed', moisturePct: 0 }, corners: SQUARE_TOE };

describe('PileForm, surveyed pile', () => {
  afterEach(() => Reflect.deleteProperty(navigator, 'geolocation'));

  it('shows the surveyed volume of the points taken and refuses to save with fewer than three inside the toe', async () => {
    fakeGps([{ x: 0, y: 0, accuracyM: 3.2 }]);
    const { store, takePoint, submit, text, page } = await render('en', SURVEYED_DRAFT);

    await takePoint(3);

    expect(text('spot-summary')).toBe('1 of 1 points count toward the volume');
    // Apex 3 m over a 12 m square toe is a square pyramid: V = s²h/3 = 144 m³ (closed form).
    expect(text('surveyed-estimate')).toContain('volume 144 m³');
    expect(text('surveyed-estimate')).toContain('at least 3 spot heights inside the footprint (1 so far)');
    await submit();
    expect(page.querySelector('[role="alert"]')!.textContent).toContain('A surveyed pile needs at least 3 spot heights inside the footprint; 1 count so far');
    expect(store.savePile).not.toHaveBeenCalled();
  });

  it('flags points outside the toe or repeated, and saves every point taken once three count', async () => {
    fakeGps([
      { x: 0, y: 0, accuracyM: 2 }, { x: 40, y: 0, accuracyM: 2 }, { x: 0, y: 0.004, accuracyM: 2 },
      { x: 3, y: 0, accuracyM: 2 }, { x: -3, y: 0, accuracyM: 2 },
    ]);
    const { store, takePoint, submit, text, page } = await render('en', SURVEYED_DRAFT);

    for (const heightM of [3, 1, 3, 1.5, 1.5]) await takePoint(heightM);

    expect(page.querySelectorAll('[data-testid="flag-outside"]')).toHaveLength(1);
    expect(text('flag-repeated')).toContain('same place as point 1: not counted');
    expect(text('spot-summary')).toBe('3 of 5 points count toward the volume');
    await submit();
    const [pile] = store.savePile.mock.calls[0] as unknown as [{ shapeModel: string; spotHeights: { heightM: number }[] }];
    // Nothing measured is lost: the flagged points are saved too, and the engine leaves them out.
    expect(pile.shapeModel).toBe('surveyed');
    expect(pile.spotHeights.map((spot) => spot.heightM)).toEqual([3, 1, 3, 1.5, 1.5]);
  });

  it('refuses a fix worse than ±10 m with its accuracy, in the crew language, and keeps no point', async () => {
    fakeGps([{ x: 0, y: 0, accuracyM: 24 }]);
    const { takePoint, text } = await render('fr', SURVEYED_DRAFT);

    await takePoint(3);

    expect(text('spot-notice')).toContain('±24 m');
    expect(text('spot-notice')).toContain('±10 m');
    expect(text('spot-notice')).toContain('La position n’est précise qu’à');
    expect(text('spot-summary')).toBe('0 points sur 0 comptent pour le volume');
  });

  it('keeps the spot heights in the draft and brings them back when the form is opened again', async () => {
    const spotHeights = [{ lon: lonLatAt(0, 0)[0], lat: lonLatAt(0, 0)[1], heightM: 2.5, accuracyM: 3 }];
    fakeGps([{ x: 2, y: 2, accuracyM: 4 }]);
    const { store, takePoint, text } = await render('en', { ...SURVEYED_DRAFT, spotHeights });

    expect(text('spot-summary')).toBe('1 of 1 points count toward the volume');
    await takePoint(1.2);

    const [, kept] = store.saveDraft.mock.calls.at(-1) as unknown as [string, { spotHeights: { heightM: number }[] }];
    expect(kept.spotHeights.map((spot) => spot.heightM)).toEqual([2.5, 1.2]);
  });
});
