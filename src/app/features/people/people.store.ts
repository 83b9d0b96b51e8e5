import { HttpClient } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { TranslocoService } from '@jsverse/transloco';
import { firstValueFrom } from 'rxjs';
import type { Role } from '../../../../shared/accounts/roles';
import { toApiProblem } from '../../core/http/api-error';
import { peopleProblemText } from './people-problems';

/** Where a person's account stands. */
export type PersonStatus = 'invited' | 'active' | 'disabled';

/** A person as `GET /api/people` answers. */
export interface Person {
  readonly id: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly labName: string | null;
  readonly siteIds: readonly string[];
  readonly status: PersonStatus;
  readonly isDisabled: boolean;
  readonly devices: readonly { id: string; name: string; lastSeenAt: string | null; lastSyncAt: string | null }[];
  readonly createdAt: string | null;
}

/** A site as `GET /api/sites` answers. */
export interface SiteRecord {
  readonly id: string;
  readonly code: string;
  readonly name: string;
  readonly processingLat: number | null;
  readonly processingLon: number | null;
  readonly economics: Record<string, unknown> | null;
}

/** What the server said about the e-mail it sent. */
export interface SentMail {
  readonly id: string;
  readonly status: 'sending' | 'sent' | 'failed';
  readonly errorMessage: string | null;
}

export interface InvitationDraft {
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly labName?: string;
  readonly siteIds: readonly string[];
}

export type PersonChanges = Partial<Pick<Person, 'name' | 'role' | 'labName' | 'siteIds' | 'isDisabled'>>;
export type SiteDraft = Pick<SiteRecord, 'code' | 'name' | 'processingLat' | 'processingLon'>;

/**
 * People and sites for the admin screen. These live on the server only (admins work online), so
 * the store holds the last answer in signals and reloads after each change.
 */
@Injectable({ providedIn: 'root' })
export class PeopleStore {
  private readonly http = inject(HttpClient);
  private readonly transloco = inject(TranslocoService);
  readonly people = signal<readonly Person[]>([]);
  readonly sites = signal<readonly SiteRecord[]>([]);
  readonly isLoading = signal(false);
  readonly problem = signal<string | null>(null);

  async load(): Promise<void> {
    this.isLoading.set(true);
    this.problem.set(null);
    try {
      const [people, sites] = await Promise.all([
        firstValueFrom(this.http.get<{ items: Person[] }>('/api/people')),
        firstValueFrom(this.http.get<{ items: SiteRecord[] }>('/api/sites')),
      ]);
      this.people.set(people.items);
      this.sites.set(sites.items);
    } catch (error) {
      this.problem.set(peopleProblemText(this.transloco, toApiProblem(error)));
    } finally {
      this.isLoading.set(false);
    }
  }

  async invite(draft: InvitationDraft): Promise<{ person: Person; mail: SentMail }> {
    const result = await firstValueFrom(this.http.post<{ person: Person; mail: SentMail }>('/api/people/invitations', draft));
    this.people.update((people) => [...people, result.person].sort((a, b) => a.name.localeCompare(b.name)));
    return result;
  }

  async resendInvitation(personId: string): Promise<SentMail> {
    return (await firstValueFrom(this.http.post<{ mail: SentMail }>(`/api/people/${personId}/invitation`, {}))).mail;
  }

  async update(personId: string, changes: PersonChanges): Promise<Person> {
    const person = await firstValueFrom(this.http.patch<Person>(`/api/people/${personId}`, changes));
    this.people.update((people) => people.map((candidate) => (candidate.id === person.id ? person : candidate)));
    return person;
  }

  async saveSite(draft: SiteDraft, siteId: string | null): Promise<SiteRecord> {
    const site = siteId
      ? await firstValueFrom(this.http.patch<SiteRecord>(`/api/sites/${siteId}`, draft))
      : await firstValueFrom(this.http.post<SiteRecord>('/api/sites', draft));
    this.sites.update((sites) => [...sites.filter((candidate) => candidate.id !== site.id), site].sort((a, b) => a.code.localeCompare(b.code)));
    return site;
  }
}
