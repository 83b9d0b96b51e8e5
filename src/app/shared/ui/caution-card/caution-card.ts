import { Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { TranslocoPipe } from '@jsverse/transloco';
import type { Caution } from '../../../../../shared/safety/cautions';

/**
 * One safety caution: icon, title, the actions to take and the source of the advice, in the crew's
 * language (shared/safety/cautions.ts holds the English; the source citation stays as published).
 */
@Component({
  selector: 'hs-caution-card',
  imports: [MatIconModule, TranslocoPipe],
  template: `
    <article class="caution" [attr.aria-labelledby]="'caution-' + caution().hazard">
      <header>
        <mat-icon aria-hidden="true">{{ caution().icon }}</mat-icon>
        <h3 [id]="'caution-' + caution().hazard">{{ 'ui.caution.hazards.' + caution().hazard + '.title' | transloco }}</h3>
      </header>
      <ul>
        @for (action of caution().actions; track $index) {
          <li>{{ 'ui.caution.hazards.' + caution().hazard + '.actions.' + $index | transloco }}</li>
        }
      </ul>
      <p class="source">{{ 'ui.caution.source' | transloco: { source: caution().source } }}</p>
    </article>
  `,
  styles: `
    .caution {
      border: 2px solid var(--mat-sys-outline); border-left-width: 8px; border-radius: 12px;
      padding: 12px 16px; background: var(--mat-sys-surface-container-low);
    }
    header { display: flex; align-items: center; gap: 8px; }
    header mat-icon { color: var(--hs-warn); }
    h3 { margin: 0; }
    ul { margin: 8px 0; padding-left: 20px; }
    li { margin: 4px 0; }
    .source { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); margin: 0; }
  `,
})
export class CautionCard {
  readonly caution = input.required<Caution>();
}
