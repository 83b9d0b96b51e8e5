import { DOCUMENT, Injectable, effect, inject, signal } from '@angular/core';

const STORAGE_KEY = 'heapsight.sunlight';

/** Switches the high-contrast "sunlight" theme and remembers the choice on this device. */
@Injectable({ providedIn: 'root' })
export class DisplayMode {
  private readonly document = inject(DOCUMENT);
  readonly isSunlight = signal(readStoredChoice());

  constructor() {
    effect(() => {
      const isSunlight = this.isSunlight();
      this.document.documentElement.classList.toggle('sunlight', isSunlight);
      try {
        localStorage.setItem(STORAGE_KEY, isSunlight ? '1' : '0');
      } catch {
        // Storage can be full or blocked; the theme still applies for this visit.
      }
    });
  }

  toggleSunlight(): void {
    this.isSunlight.update((value) => !value);
  }
}

function readStoredChoice(): boolean {
  try {
    return localStorage.getItem(STORAGE_KEY) === '1';
  } catch {
    return false;
  }
}
