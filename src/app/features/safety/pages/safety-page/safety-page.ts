import { Component } from '@angular/core';
import { TranslocoPipe } from '@jsverse/transloco';
import { CAUTIONS } from '../../../../../../shared/safety/cautions';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';

/** All safety cautions in one place, readable offline, in the crew's language. */
@Component({
  selector: 'hs-safety-page',
  imports: [CautionCard, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1>{{ 'safety.title' | transloco }}</h1>
      <p class="statement">{{ 'common.planningStatement' | transloco }}</p>
      <div class="hs-card-grid">
        @for (caution of cautions; track caution.hazard) {
          <hs-caution-card [caution]="caution" />
        }
      </div>
    </section>
  `,
  styles: `.statement { font: var(--mat-sys-title-medium); border-left: 6px solid var(--mat-sys-primary); padding-left: 12px; }`,
})
export default class SafetyPage {
  protected readonly cautions = CAUTIONS;
}
