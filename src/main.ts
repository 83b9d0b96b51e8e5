import { bootstrapApplication } from '@angular/platform-browser';
import { appConfig } from './app/app.config';
import { App } from './app/app';

// Capture is the first screen of most starts (the default route, the crew's home): fetch its code
// and the device database now, alongside the app's start-up, instead of after the router has loaded
// the capture routes and then the screen (two round trips later). The router's own imports of the
// same chunks then find them loaded. Other first screens do not pay for it.
if (/^\/(capture\/?)?$/.test(location.pathname)) {
  void import('./app/features/capture/capture.routes');
  void import('./app/features/capture/pages/capture-home/capture-home');
  void import('./app/core/db/device-queries');
}

bootstrapApplication(App, appConfig).catch((error: unknown) => console.error(error));
