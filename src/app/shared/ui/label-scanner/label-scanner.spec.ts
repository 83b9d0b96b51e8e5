import { TestBed } from '@angular/core/testing';
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
