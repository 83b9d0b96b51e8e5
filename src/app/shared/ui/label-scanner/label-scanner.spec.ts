import { TestBed } from '@angular/core/testing';
import { AppLanguage } from '../../../i18n/app-language';
import { LabelScanner } from './label-scanner';

describe('LabelScanner', () => {
  const originalMediaDevices = Object.getOwnPropertyDescriptor(navigator, 'mediaDevices');

  afterEach(() => {
    jest.restoreAllMocks();
    if (originalMediaDevices) Object.defineProperty(navigator, 'mediaDevices', originalMediaDevices);
    else delete (navigator as { mediaDevices?: unknown }).mediaDevices;
  });

  function useCamera(getUserMedia: () => Promise<MediaStream>): void {
    Object.defineProperty(navigator, 'mediaDevices', { configurable: true, value: { getUserMedia } });
  }

  async function render() {
    const fixture = TestBed.createComponent(LabelScanner);
    fixture.detectChanges();
    await fixture.whenStable();
    fixture.detectChanges();
    return fixture;
  }

  it('when the camera is refused, says so and points to typing the code', async () => {
    useCamera(() => Promise.reject(new DOMException('denied', 'NotAllowedError')));

    const fixture = await render();

    expect((fixture.nativeElement as HTMLElement).querySelector('[role=alert]')?.textContent).toContain('Type the code from the label instead');
  });

  it('in French, says the camera was refused, names the region and the stop button in French', async () => {
    useCamera(() => Promise.reject(new DOMException('denied', 'NotAllowedError')));
    await TestBed.inject(AppLanguage).use('fr');

    const fixture = await render();
    const element = fixture.nativeElement as HTMLElement;

    expect(element.querySelector('[role=alert]')?.textContent).toContain('La caméra ne s’est pas ouverte');
    expect(element.querySelector('[role=alert]')?.textContent).toContain('Saisissez plutôt le code inscrit sur l’étiquette.');
    expect(element.querySelector('[role=region]')?.getAttribute('aria-label')).toBe('Lecteur d’étiquettes');
    expect(element.querySelector('button')?.textContent).toContain('Arrêter la lecture');
  });

  it('when the browser has no camera at all, says so in the active language', async () => {
    Object.defineProperty(navigator, 'mediaDevices', { configurable: true, value: undefined });

    const fixture = await render();
    const alert = () => (fixture.nativeElement as HTMLElement).querySelector('[role=alert]')?.textContent;
    expect(alert()).toContain('This browser cannot open the camera here.');

    await TestBed.inject(AppLanguage).use('sw');
    await fixture.whenStable();
    fixture.detectChanges();
    expect(alert()).toContain('Kivinjari hiki hakiwezi kufungua kamera hapa.');
  });

  it('while the camera looks for a label, tells the person how to hold it, in the active language', async () => {
    const stream = { getTracks: () => [{ stop: jest.fn() }] } as unknown as MediaStream;
    useCamera(() => Promise.resolve(stream));
    jest.spyOn(HTMLMediaElement.prototype, 'play').mockResolvedValue(undefined);
    jest.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null);
    await TestBed.inject(AppLanguage).use('fr');

    const fixture = await render();

    expect((fixture.nativeElement as HTMLElement).querySelector('[role=status]')?.textContent).toBe('Tenez l’étiquette dans l’image, à environ une main de distance.');
  });

  it('when "Stop scanning" is tapped, stops the camera and emits cancelled', async () => {
    const stop = jest.fn();
    const stream = { getTracks: () => [{ stop }] } as unknown as MediaStream;
    useCamera(() => Promise.resolve(stream));
    jest.spyOn(HTMLMediaElement.prototype, 'play').mockResolvedValue(undefined);
    // jsdom draws no canvas; the frame loop then does nothing, which is all this test needs.
    jest.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null);
    const fixture = await render();
    const cancelled = jest.fn();
    fixture.componentInstance.cancelled.subscribe(cancelled);

    (fixture.nativeElement as HTMLElement).querySelector('button')?.click();

    expect(cancelled).toHaveBeenCalledTimes(1);
    expect(stop).toHaveBeenCalled();
  });
});
