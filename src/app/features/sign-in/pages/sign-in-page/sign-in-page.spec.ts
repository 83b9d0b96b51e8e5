import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { AuthSession } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import SignInPage from './sign-in-page';

async function setUp(returnUrl?: string) {
  localStorage.clear();
  TestBed.configureTestingModule({ imports: [SignInPage], providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
  const fixture = TestBed.createComponent(SignInPage);
  if (returnUrl) {
    fixture.componentRef.setInput('returnUrl', returnUrl);
  }
  fixture.detectChanges();
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const type = (selector: string, value: string) => {
    const input = element.querySelector(selector) as HTMLInputElement;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  return { fixture, element, type, server: TestBed.inject(HttpTestingController) };
}

describe('SignInPage', () => {
  it('signs in with this device’s id and name, stores the session and goes to the return address', async () => {
    const { fixture, element, type, server } = await setUp('/people');
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    type('input[formcontrolname=email]', 'admin@demo.heapsight.test');
    type('input[formcontrolname=password]', 'heapsight-demo');
    type('input[formcontrolname=deviceName]', 'Office laptop');
    (element.querySelector('button[type=submit]') as HTMLButtonElement).click();

    const login = server.expectOne('/api/auth/login');
    expect(login.request.body).toEqual({
      email: 'admin@demo.heapsight.test', password: 'heapsight-demo', deviceId: expect.stringMatching(/^[0-9a-f-]{36}$/), deviceName: 'Office laptop',
    });
    login.flush({ accessToken: 'a', refreshToken: 'r', user: { id: 'u', email: 'admin@demo.heapsight.test', name: 'Omari Keys', role: 'admin', siteIds: [], sites: [], deviceId: login.request.body.deviceId, deviceName: 'Office laptop', organizationId: 'o', labName: null } });
    await fixture.whenStable();

    expect(TestBed.inject(AuthSession).user()?.name).toBe('Omari Keys');
    expect(navigate).toHaveBeenCalledWith('/people');
    server.verify();
  });

  it('shows the server’s words when the e-mail or password is wrong, and clears the password', async () => {
    const { fixture, element, type, server } = await setUp();
    type('input[formcontrolname=email]', 'admin@demo.heapsight.test');
    type('input[formcontrolname=password]', 'wrong');
    (element.querySelector('button[type=submit]') as HTMLButtonElement).click();
    server.expectOne('/api/auth/login').flush({ error: { code: 'unauthenticated', message: 'E-mail or password is wrong', details: null } }, { status: 401, statusText: 'Unauthorized' });
    await fixture.whenStable();
    fixture.detectChanges();

    expect(element.querySelector('[role=alert]')?.textContent).toContain('E-mail or password is wrong');
    expect((element.querySelector('input[formcontrolname=password]') as HTMLInputElement).value).toBe('');
    expect(TestBed.inject(AuthSession).isSignedIn()).toBe(false);
  });

  it('sends nothing while the form is incomplete, and says what is missing', async () => {
    const { fixture, element, server } = await setUp();
    (element.querySelector('button[type=submit]') as HTMLButtonElement).click();
    fixture.detectChanges();
    server.expectNone('/api/auth/login');
    expect(element.textContent).toContain('Enter your e-mail address');
    expect(element.textContent).toContain('Enter your password');
  });

  it('says that nothing is lost when the sign-in has to be renewed', async () => {
    localStorage.setItem('heapsight.needs-sign-in', 'true');
    TestBed.configureTestingModule({ imports: [SignInPage], providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(SignInPage);
    fixture.detectChanges();
    expect(fixture.nativeElement.textContent).toContain('Everything captured on this phone is kept');
  });

  it('lets a crew choose the language before signing in, and explains a refusal in it', async () => {
    const { fixture, element, type, server } = await setUp();
    const picker = element.querySelector('hs-language-picker button.toggle') as HTMLButtonElement;
    picker.click();
    fixture.detectChanges();
    (element.querySelector('hs-language-picker button[lang=sw]') as HTMLButtonElement).click();
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.querySelector('h1')?.textContent).toContain('Ingia');
    expect(element.textContent).toContain('Umesahau nenosiri?');

    await TestBed.inject(AppLanguage).use('fr');
    fixture.detectChanges();
    type('input[formcontrolname=email]', 'admin@demo.heapsight.test');
    type('input[formcontrolname=password]', 'wrong');
    (element.querySelector('button[type=submit]') as HTMLButtonElement).click();
    server.expectOne('/api/auth/login').flush({ error: { code: 'unauthenticated', message: 'E-mail or password is wrong', details: null } }, { status: 401, statusText: 'Unauthorized' });
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.querySelector('[role=alert]')?.textContent).toContain('E-mail ou mot de passe incorrect');
    expect(element.querySelector('h1')?.textContent).toContain('Se connecter');
  });

  it('keeps the server’s own words for a refusal this form has no translation for', async () => {
    const { fixture, element, type, server } = await setUp();
    await TestBed.inject(AppLanguage).use('sw');
    type('input[formcontrolname=email]', 'admin@demo.heapsight.test');
    type('input[formcontrolname=password]', 'heapsight-demo');
    (element.querySelector('button[type=submit]') as HTMLButtonElement).click();
    server.expectOne('/api/auth/login').flush({ error: { code: 'payload_too_large', message: 'The request body is too large', details: null } }, { status: 413, statusText: 'Too Large' });
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.querySelector('[role=alert]')?.textContent).toContain('The request body is too large');
  });
});
