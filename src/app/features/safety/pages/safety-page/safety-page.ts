import { Component } from '@angular/core';
import { CAUTIONS, PLANNING_ESTIMATE_STATEMENT } from '../../../../../../shared/safety/cautions';
import { CautionCard } from '../../../../shared/ui/caution-card/caution-card';

/** All safety cautions in one place, readable offline. */
@Component({
  selector: 'hs-safety-page',
  imports: [CautionCard],
  template: `
    <section class="hs-page">
      <h1>Safety at the piles</h1>
      <p class="statement">{{ statement }}</p>
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
  protected readonly statement = PLANNING_ESTIMATE_STATEMENT;
}
