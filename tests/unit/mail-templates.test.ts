import { describe, expect, it } from 'vitest';
import { escapeHtml, renderMessage } from '~/server/mail/templates/layout';
import { invitationMessage } from '~/server/mail/templates/team-messages';
import { trialEndingMessage } from '~/server/mail/templates/member-messages';

describe('mail templates', () => {
  it('escapes names and links in the HTML part but keeps them as typed in the text part', () => {
    const m = renderMessage({
      subject: 'Hello',
      studioName: 'Salt & <Stone>',
      preview: 'p',
      greeting: 'Hi "Jo",',
      paragraphs: ['<script>alert(1)</script>'],
      action: { label: 'Go', url: 'https://studio.example/a?x=1&y="2"' },
      reason: 'r',
    });
    expect(m.html).not.toContain('<script>');
    expect(m.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(m.html).toContain('Salt &amp; &lt;Stone&gt;');
    expect(m.html).toContain('href="https://studio.example/a?x=1&amp;y=&quot;2&quot;"');
    expect(m.text).toContain('<script>alert(1)</script>');
    expect(m.text).toContain('Go: https://studio.example/a?x=1&y="2"');
    expect(escapeHtml(`'`)).toBe('&#39;');
  });

  it('does not double the full stop after a studio name that ends in one', () => {
    const m = trialEndingMessage({
      studioName: 'Northside Studio Ltd.',
      name: 'Kim Example',
      endsOn: 'Friday 6 March 2026',
      daysLeft: 2,
      price: null,
      continues: true,
      accountUrl: 'https://studio.example/account',
    });
    expect(m.text).toContain('started a free trial at Northside Studio Ltd.\n');
    expect(m.text).not.toMatch(/Ltd\.\./);
    expect(m.text).toContain('your membership carries on, and you keep every class');
    expect(m.subject).toBe('Your Northside Studio Ltd. trial ends in 2 days');
  });

  it.each([
    ['coach', 'as a coach'],
    ['editor', 'as an editor'],
  ] as const)('words the %s invitation with the right article', (role, words) => {
    const m = invitationMessage({ studioName: 'Studio', inviterName: null, role, url: 'https://studio.example/i/t', expiresOn: 'Monday 1 June 2026' });
    expect(m.subject).toBe(`The team at Studio invited you to join Studio ${words}`);
    expect(m.text).toContain('ask the studio owner to send a new one');
  });
});
