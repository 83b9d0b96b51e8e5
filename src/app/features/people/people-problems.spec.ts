import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import type { ApiProblem } from '../../core/http/api-error';
import { AppLanguage } from '../../i18n/app-language';
import { peopleProblemText } from './people-problems';

const refusal = (code: ApiProblem['code'], message: string, details: ApiProblem['details'] = []): ApiProblem => ({ status: 400, code, message, details });

describe('peopleProblemText', () => {
  afterEach(() => localStorage.clear());

  it('says what a code means for the action tried, in the active language', async () => {
    await TestBed.inject(AppLanguage).use('fr');
    const transloco = TestBed.inject(TranslocoService);
    const taken = refusal('conflict', 'Someone with this e-mail address already has an account');
    expect(peopleProblemText(transloco, taken, { conflict: 'people.problems.emailTaken' })).toBe('Une personne avec cette adresse e-mail a déjà un compte');
    expect(peopleProblemText(transloco, refusal('conflict', 'Site code JR is already used'), { conflict: 'people.problems.siteCodeTaken' }, { code: 'JR' }))
      .toBe('Le code de site JR est déjà utilisé');
  });

  it('names the field the server found wrong, before the code', async () => {
    await TestBed.inject(AppLanguage).use('sw');
    const transloco = TestBed.inject(TranslocoService);
    const missingLab = refusal('validation_failed', 'A lab contact needs the name of their laboratory', [{ path: 'labName', message: 'Required for the lab role' }]);
    expect(peopleProblemText(transloco, missingLab)).toBe('Mwakilishi wa maabara anahitaji jina la maabara yake');
  });

  it('keeps the server’s words and first detail for what it cannot explain', () => {
    const transloco = TestBed.inject(TranslocoService);
    const odd = refusal('validation_failed', 'The invitation is not valid', [{ path: 'siteIds.0', message: 'Invalid UUID' }]);
    expect(peopleProblemText(transloco, odd)).toBe('The invitation is not valid: Invalid UUID');
    expect(peopleProblemText(transloco, refusal('conflict', 'Only people who have not accepted their invitation can be sent a new one')))
      .toBe('Only people who have not accepted their invitation can be sent a new one');
  });
});
