import { DecimalPipe } from '@angular/common';
import { Component, OnInit, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

/** What the browser reports about this device's storage for our origin. */
interface DeviceStorage {
  readonly usedBytes: number;
  readonly quotaBytes: number;
  readonly isPersisted: boolean;
}

/** The crew's home screen: what this device holds, and the way to the safety cautions. */
@Component({
  selector: 'hs-capture-home',
  imports: [DecimalPipe, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './capture-home.html',
  styleUrl: './capture-home.scss',
})
export default class CaptureHome implements OnInit {
  protected readonly storage = signal<DeviceStorage | null>(null);

  async ngOnInit(): Promise<void> {
    const manager = typeof navigator === 'undefined' ? undefined : navigator.storage;
    if (!manager?.estimate) {
      return;
    }
    const [estimate, isPersisted] = await Promise.all([
      manager.estimate(),
      manager.persisted ? manager.persisted() : Promise.resolve(false),
    ]);
    this.storage.set({ usedBytes: estimate.usage ?? 0, quotaBytes: estimate.quota ?? 0, isPersisted });
  }

  protected percentUsed(storage: DeviceStorage): number {
    return storage.quotaBytes > 0 ? (100 * storage.usedBytes) / storage.quotaBytes : 0;
  }
}
