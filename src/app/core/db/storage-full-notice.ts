import { Injectable, inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { TranslocoService } from '@jsverse/transloco';
import { StorageFullError, isStorageFull } from './storage-full';

/**
 * Tells the crew, in words they can act on, that the phone is full, and turns the browser's error
 * into a StorageFullError so the form that asked for the write stays open with what was typed.
 * What was saved before is untouched: each record and its outbox entry are written in one
 * transaction, so a refused write leaves neither.
 */
@Injectable({ providedIn: 'root' })
export class StorageFullNotice {
  private readonly snackBar = inject(MatSnackBar);
  private readonly transloco = inject(TranslocoService);
  /** One notice at a time: draft saves while typing would otherwise stack them. */
  private isShown = false;

  /** Runs a device write; when the phone is full, shows the notice and rejects with StorageFullError. */
  async guard<T>(write: () => Promise<T>): Promise<T> {
    try {
      return await write();
    } catch (error) {
      if (!isStorageFull(error)) throw error;
      this.show();
      throw error instanceof StorageFullError ? error : new StorageFullError(error);
    }
  }

  /**
   * The message stays until dismissed (no timeout: a crew member may be looking at the pile, not the
   * phone). It sits at the top, clear of the Save button it asks the crew to tap again, and its one
   * button only closes it: leaving the form would lose what the phone had no room to keep.
   */
  show(): void {
    if (this.isShown) return;
    this.isShown = true;
    const reference = this.snackBar.open(this.transloco.translate('core.storageFull.message'), this.transloco.translate('core.storageFull.action'), {
      politeness: 'assertive', panelClass: 'storage-full-notice', verticalPosition: 'top',
    });
    reference.afterDismissed().subscribe(() => (this.isShown = false));
  }
}
