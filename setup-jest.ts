import { TestBed } from '@angular/core/testing';
import { setupZonelessTestEnv } from 'jest-preset-angular/setup-env/zoneless';
import { provideI18nTesting } from './src/testing/i18n-testing';

setupZonelessTestEnv();

// Every component speaks through Transloco; each test module gets the real English strings (a test
// that switches language can still do so). configureTestingModule calls add up, so a spec's own
// providers come on top of these.
beforeEach(() => TestBed.configureTestingModule({ providers: [provideI18nTesting()] }));
