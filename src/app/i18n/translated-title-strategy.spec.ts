import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Title } from '@angular/platform-browser';
import { Router, TitleStrategy, provideRouter } from '@angular/router';
import { AppLanguage } from './app-language';
import { TranslatedTitleStrategy } from './translated-title-strategy';

@Component({ template: '' })
class Blank {}

describe('TranslatedTitleStrategy', () => {
  it('names the tab after the screen in the active language and renames it on a switch', async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'piles', title: 'common.titles.piles', component: Blank }]),
        { provide: TitleStrategy, useClass: TranslatedTitleStrategy },
      ],
    });
    await TestBed.inject(Router).navigateByUrl('/piles');
    const title = TestBed.inject(Title);
    expect(title.getTitle()).toBe('Piles · Heapsight');
    await TestBed.inject(AppLanguage).use('sw');
    expect(title.getTitle()).toBe('Marundo · Heapsight');
  });
});
