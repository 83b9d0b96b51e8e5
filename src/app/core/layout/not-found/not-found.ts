import { Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { TranslocoPipe } from '@jsverse/transloco';

/** Shown for an address the app does not know. */
@Component({
  selector: 'hs-not-found',
  imports: [MatButtonModule, RouterLink, TranslocoPipe],
  template: `
    <section class="hs-page">
      <h1>{{ 'profile.notFound.title' | transloco }}</h1>
      <p>{{ 'profile.notFound.explain' | transloco }}</p>
      <a mat-flat-button routerLink="/capture">{{ 'profile.notFound.goToCapture' | transloco }}</a>
    </section>
  `,
})
export default class NotFound {}
