import { Component, ElementRef, OnInit, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar, MatSnackBarModule } from '@angular/material/snack-bar';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { ROLE_LABELS } from '../../../../core/auth/role-labels';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { InviteDialog } from '../../components/invite-dialog/invite-dialog';
import { PersonDialog } from '../../components/person-dialog/person-dialog';
import { SiteDialog } from '../../components/site-dialog/site-dialog';
import { PeopleStore, type Person, type SentMail, type SiteRecord } from '../../people.store';

/** Rows per page: a phone screen shows about ten rows of this table. */
const PAGE_SIZES = [10, 25, 100];

const STATUS_ICONS: Record<Person['status'], string> = { active: 'check_circle', invited: 'schedule_send', disabled: 'block' };
/** How each account status is written (translation keys). */
const STATUS_KEYS: Record<Person['status'], string> = { active: 'people.status.active', invited: 'people.status.invited', disabled: 'people.status.disabled' };

/** `People & sites` (admin): who may sign in, with which role and on which sites; and the sites. */
@Component({
  selector: 'hs-people-page',
  imports: [
    MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatPaginatorModule, MatProgressBarModule,
    MatSnackBarModule, MatSortModule, MatTableModule, TranslocoPipe, LOCALE_FORMAT_PIPES,
  ],
  templateUrl: './people-page.html',
  styleUrl: './people-page.scss',
})
export default class PeoplePage implements OnInit {
  protected readonly store = inject(PeopleStore);
  private readonly dialogs = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);

  protected readonly pageSizes = PAGE_SIZES;
  protected readonly columns = ['name', 'role', 'sites', 'status', 'actions'];
  protected readonly siteColumns = ['code', 'name', 'processing', 'actions'];
  protected readonly filter = signal('');
  protected readonly sortState = signal<Sort>({ active: 'name', direction: 'asc' });
  protected readonly page = signal({ index: 0, size: PAGE_SIZES[0] as number });
  private readonly siteCodes = computed(() => new Map(this.store.sites().map((site) => [site.id, site.code])));

  /** People matching the filter (role and status as the reader sees them), in the chosen order; the table shows one page of them. */
  protected readonly matchingPeople = computed(() => {
    const filter = this.filter().trim().toLowerCase();
    this.language.active(); // role and status words change with the language
    const words = (key: string) => this.transloco.translate(key);
    const matching = this.store.people().filter((person) =>
      [person.name, person.email, person.role, words(ROLE_LABELS[person.role].label), person.status, words(STATUS_KEYS[person.status]),
        person.labName ?? '', this.codesOf(person)]
        .join(' ').toLowerCase().includes(filter),
    );
    const { active, direction } = this.sortState();
    const key = (person: Person) =>
      active === 'sites' ? this.codesOf(person) : active === 'role' ? person.role : active === 'status' ? person.status : person.name.toLowerCase();
    return direction === '' ? matching : [...matching].sort((a, b) => key(a).localeCompare(key(b)) * (direction === 'asc' ? 1 : -1));
  });
  protected readonly visiblePeople = computed(() => {
    const { index, size } = this.page();
    return this.matchingPeople().slice(index * size, (index + 1) * size);
  });

  ngOnInit(): void {
    void this.store.load();
  }

  protected roleOf(person: Person): (typeof ROLE_LABELS)[Person['role']] {
    return ROLE_LABELS[person.role];
  }

  protected statusIcon(person: Person): string {
    return STATUS_ICONS[person.status];
  }

  protected statusKey(person: Person): string {
    return STATUS_KEYS[person.status];
  }

  protected scrollTo(id: string): void {
    this.host.nativeElement.querySelector(`#${id}`)?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  }

  protected changeFilter(value: string): void {
    this.filter.set(value);
    this.page.update((page) => ({ ...page, index: 0 }));
  }

  protected changePage(event: PageEvent): void {
    this.page.set({ index: event.pageIndex, size: event.pageSize });
  }

  protected codesOf(person: Person): string {
    return person.siteIds.map((id) => this.siteCodes().get(id) ?? '?').sort().join(', ');
  }

  protected invite(): void {
    this.dialogs
      .open<InviteDialog, { sites: readonly SiteRecord[] }, SentMail>(InviteDialog, { data: { sites: this.store.sites() }, autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((mail) => {
        if (mail) {
          const message = mail.status === 'sent'
            ? this.transloco.translate('people.snack.invitationSent')
            : this.transloco.translate('people.snack.mailFailed', { error: mail.errorMessage ?? '' });
          this.snackBar.open(message, this.transloco.translate('people.snack.ok'), { duration: 6000 });
        }
      });
  }

  protected edit(person: Person): void {
    this.dialogs
      .open<PersonDialog, { person: Person; sites: readonly SiteRecord[] }, string>(PersonDialog, { data: { person, sites: this.store.sites() } })
      .afterClosed()
      .subscribe((message) => {
        if (message) {
          this.snackBar.open(message, this.transloco.translate('people.snack.ok'), { duration: 4000 });
        }
      });
  }

  protected editSite(site: SiteRecord | null): void {
    this.dialogs
      .open<SiteDialog, { site: SiteRecord | null }, SiteRecord>(SiteDialog, { data: { site } })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) {
          this.snackBar.open(this.transloco.translate('people.snack.siteSaved', { code: saved.code }), this.transloco.translate('people.snack.ok'), { duration: 4000 });
        }
      });
  }
}
