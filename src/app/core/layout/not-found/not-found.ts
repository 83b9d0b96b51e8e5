import { Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown for an address the app does not know. */
@Component({
  selector: 'hs-not-found',
  imports: [MatButtonModule, RouterLink],
  template: `
    <section class="hs-page">
      <h1>Page not found</h1>
      <p>This address is not a Heapsight screen.</p>
      <a mat-flat-button routerLink="/capture">Go to Capture</a>
    </section>
  `,
})
export default class NotFound {}
