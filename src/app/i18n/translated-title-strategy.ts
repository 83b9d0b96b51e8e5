import { Injectable, inject } from '@angular/core';
import { Title } from '@angular/platform-browser';
import { type RouterStateSnapshot, TitleStrategy } from '@angular/router';
import { TranslocoService } from '@jsverse/transloco';

/**
 * Routes name their screen by a translation key (`title: 'common.titles.piles'`); the browser tab and
 * screen readers get "<screen> · Heapsight" in the active language, renamed when the language changes.
 */
@Injectable({ providedIn: 'root' })
export class TranslatedTitleStrategy extends TitleStrategy {
  private readonly title = inject(Title);
  private readonly transloco = inject(TranslocoService);
  private lastKey: string | undefined;

  constructor() {
    super();
    this.transloco.langChanges$.subscribe(() => this.apply());
  }

  override updateTitle(snapshot: RouterStateSnapshot): void {
    this.lastKey = this.buildTitle(snapshot);
    this.apply();
  }

  private apply(): void {
    if (this.lastKey === undefined) return;
    this.title.setTitle(`${this.transloco.translate(this.lastKey)} · Heapsight`);
  }
}
