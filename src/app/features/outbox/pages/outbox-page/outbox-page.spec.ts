import { splitLinks } from './outbox-page';

describe('splitLinks', () => {
  it('turns web addresses into links and leaves the rest as text', () => {
    expect(splitLinks('Choose it here:\nhttp://heapsight.test/set-password?token=abc\nThanks')).toEqual([
      { text: 'Choose it here:\n', isLink: false },
      { text: 'http://heapsight.test/set-password?token=abc', isLink: true },
      { text: '\nThanks', isLink: false },
    ]);
  });

  it('never makes a link of another scheme', () => {
    expect(splitLinks('javascript:alert(1)')).toEqual([{ text: 'javascript:alert(1)', isLink: false }]);
  });
});
