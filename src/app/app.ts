import { Component } from '@angular/core';
import { Shell } from './core/layout/shell/shell';

/** Root component: the shell holds the toolbar, navigation and routed page. */
@Component({
  selector: 'hs-root',
  imports: [Shell],
  template: '<hs-shell />',
})
export class App {}
