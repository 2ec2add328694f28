import { describe, expect, it } from 'vitest';
import { renderMail } from '../../server/adapters/mail/render-mail';
import { parseEnvironment, toAppConfig } from '../../server/config';
import { slugify } from '../../server/modules/clients/clients.service';
import { generateDemoPeople } from '../../scripts/lib/demo-scenario';

describe('configuration', () => {
  it('uses the documented defaults', () => {
    const config = toAppConfig(parseEnvironment({}));
    expect(config.publicUrl).toBe('http://localhost:3000');
    expect(config.invitationLinkTtlMs).toBe(7 * 24 * 3_600_000);
    expect(config.signInLinkTtlMs).toBe(30 * 60_000);
  });

  it('fails loudly, naming the variable, on a bad value', () => {
    expect(() => parseEnvironment({ PORT: 'eighty' })).toThrow(/PORT/);
    expect(() => parseEnvironment({ SMTP_URL: 'not a url' })).toThrow(/SMTP_URL/);
  });
});

describe('client slugs', () => {
  it.each([
    ['Halvorsen & Pike Engineering', 'halvorsen-and-pike-engineering'],
    ['  Ærø Shipping ', 'aero-shipping'],
    ['Straße 9 GmbH', 'strasse-9-gmbh'],
    ['!!!', 'client'],
  ])('%s -> %s', (name, slug) => {
    expect(slugify(name)).toBe(slug);
  });
});

describe('mail layout', () => {
  it('escapes names in the HTML part and keeps the link in both parts', () => {
    const mail = renderMail({
      heading: 'Hello <Ana & "Bo">',
      paragraphs: ['x'],
      action: { label: 'Open', url: 'http://localhost:3000/link/abc' },
    });
    expect(mail.html).toContain('Hello &lt;Ana &amp; &quot;Bo&quot;&gt;');
    expect(mail.html).not.toContain('<Ana');
    expect(mail.text).toContain('Open: http://localhost:3000/link/abc');
    expect(mail.html).toContain('href="http://localhost:3000/link/abc"');
  });
});

describe('demo scenario', () => {
  it('has about 240 invented people in Leeds, Rotterdam and Porto with unique addresses and ids', () => {
    const people = generateDemoPeople();
    expect(people).toHaveLength(240);
    expect(new Set(people.map((person) => person.office))).toEqual(
      new Set(['Leeds', 'Rotterdam', 'Porto']),
    );
    expect(new Set(people.map((person) => person.email)).size).toBe(240);
    expect(new Set(people.map((person) => person.employeeId)).size).toBe(240);
    expect(people.every((person) => person.email.endsWith('@halvorsen-pike.example'))).toBe(true);
  });

  it('is the same on every install', () => {
    expect(generateDemoPeople()).toEqual(generateDemoPeople());
  });
});
