import { Component, afterNextRender, inject } from '@angular/core';
import { Router } from '@angular/router';
import { Shell } from './core/layout/shell/shell';

/**
 * Root component: the shell holds the toolbar, navigation and routed page. The router's first
 * navigation (disabled in app.config) starts in a new task once the frame has rendered, so building
 * the frame and building the first screen are two shorter tasks instead of one long one.
 */
@Component({
  selector: 'hs-root',
  imports: [Shell],
  template: '<hs-shell />',
})
export class App {
  constructor() {
    const router = inject(Router);
    afterNextRender(() => setTimeout(() => router.initialNavigation()));
  }
}
