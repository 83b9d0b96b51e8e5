import { Component, ElementRef, inject, signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { TranslocoPipe } from '@jsverse/transloco';
import { AppLanguage } from '../app-language';
import { LANGUAGES, type LanguageCode } from '../languages';

/**
 * A button with the language's code that opens the three languages, each written in itself so a
 * reader finds their own without reading the current one. Plain elements (no Material menu) keep the
 * shell's first download small.
 */
@Component({
  selector: 'hs-language-picker',
  imports: [MatIconModule, TranslocoPipe],
  template: `
    <button type="button" class="toggle" (click)="isOpen.update((open) => !open)" [attr.aria-expanded]="isOpen()"
            aria-haspopup="true" [attr.aria-label]="'common.language.current' | transloco: { name: activeName() }">
      <mat-icon aria-hidden="true">translate</mat-icon>
      <span class="code">{{ language.active() }}</span>
    </button>
    @if (isOpen()) {
      <div class="choices" role="group" [attr.aria-label]="'common.language.choose' | transloco">
        @for (option of languages; track option.code) {
          <button type="button" [attr.lang]="option.code" [attr.aria-pressed]="option.code === language.active()"
                  (click)="choose(option.code)">
            <mat-icon aria-hidden="true">{{ option.code === language.active() ? 'radio_button_checked' : 'radio_button_unchecked' }}</mat-icon>
            <span>{{ option.name }}</span>
          </button>
        }
      </div>
    }
  `,
  styles: `
    :host { position: relative; display: inline-block; }
    button { min-height: 48px; min-width: 48px; border: 0; background: transparent; color: inherit; font: inherit; cursor: pointer; }
    .toggle { display: inline-flex; align-items: center; gap: 2px; padding: 0 8px; border-radius: 24px; }
    .toggle:hover, .toggle:focus-visible { background: color-mix(in srgb, currentColor 12%, transparent); }
    .code { font: var(--mat-sys-label-large); text-transform: uppercase; }
    .choices { position: absolute; right: 0; top: 100%; z-index: 1000; display: flex; flex-direction: column; min-width: 180px;
               padding: 4px 0; border-radius: 12px; background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface);
               box-shadow: var(--mat-sys-level2); }
    .choices button { display: flex; align-items: center; gap: 12px; padding: 0 16px; text-align: left; font: var(--mat-sys-body-large); }
    .choices button:hover, .choices button:focus-visible { background: var(--mat-sys-surface-container-highest); }
  `,
  host: { '(document:keydown.escape)': 'isOpen.set(false)', '(document:click)': 'closeIfOutside($event)' },
})
export class LanguagePicker {
  protected readonly language = inject(AppLanguage);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  protected readonly languages = LANGUAGES;
  protected readonly isOpen = signal(false);

  protected activeName(): string {
    return LANGUAGES.find((option) => option.code === this.language.active())?.name ?? '';
  }

  protected async choose(code: LanguageCode): Promise<void> {
    this.isOpen.set(false);
    await this.language.use(code);
  }

  protected closeIfOutside(event: Event): void {
    if (!this.host.nativeElement.contains(event.target as Node)) this.isOpen.set(false);
  }
}
