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

// Build the app only after the browser has painted the boot shell in index.html. When the scripts
// arrive as fast as the HTML the browser may otherwise run them before its first paint, and the
// shell, replaced by the app, never shows: the first paint then waits for the whole start-up. The
// browser reports its first contentful paint; one that does not gets a frame callback (it runs just
// before a paint, a timeout set in it just after). A hidden page (a background tab) paints nothing,
// so it starts at once, and no start waits more than a second for a paint.
function afterFirstPaint(): Promise<void> {
  return new Promise((resolve) => {
    if (document.visibilityState === 'hidden') {
      resolve();
      return;
    }
    document.addEventListener('visibilitychange', () => resolve(), { once: true });
    setTimeout(resolve, 1000);
    if (!PerformanceObserver.supportedEntryTypes?.includes('paint')) {
      requestAnimationFrame(() => setTimeout(resolve));
      return;
    }
    const observer = new PerformanceObserver((entries) => {
      if (entries.getEntriesByName('first-contentful-paint').length === 0) return;
      observer.disconnect();
      resolve();
    });
    observer.observe({ type: 'paint', buffered: true });
  });
}

void afterFirstPaint()
  .then(() => bootstrapApplication(App, appConfig))
  .catch((error: unknown) => console.error(error));
