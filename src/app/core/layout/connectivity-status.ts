import { DOCUMENT, Injectable, inject, signal } from '@angular/core';

/** Whether the browser believes it has a network, updated on the window's online/offline events. */
@Injectable({ providedIn: 'root' })
export class ConnectivityStatus {
  private readonly window = inject(DOCUMENT).defaultView;
  readonly isOnline = signal(this.window?.navigator.onLine ?? true);

  constructor() {
    this.window?.addEventListener('online', () => this.isOnline.set(true));
    this.window?.addEventListener('offline', () => this.isOnline.set(false));
  }
}
