// The e-mail's HTML part uses Sheaf's brand tokens and no other colour; the text part keeps
// everything the HTML says.
import { describe, expect, it } from 'vitest';
import { BRAND, PRINT } from '../../../shared/brand/colours';
import { composeMail } from '../../../api/mail/mailer';

const mail = composeMail({
  to: 'grower@test.example',
  subject: 'Your field packet is ready',
  paragraphs: ['Hello,', 'Your packet <for> "North field" is ready.'],
  link: { label: 'Open your field packet', url: 'https://sheaf.test/sites/1/packet?a=1&b=2' },
});

/** Every `property: value` pair in the HTML's style attributes. */
function declarations(html: string): { property: string; value: string }[] {
  return [...html.matchAll(/style="([^"]*)"/g)].flatMap((match) =>
    match[1]!
      .split(';')
      .map((part) => part.split(':'))
      .filter((pair) => pair.length >= 2)
      .map(([property, ...value]) => ({
        property: property!.trim(),
        value: value.join(':').trim(),
      })),
  );
}

describe('composeMail', () => {
  const tokens = new Set<string>([BRAND, ...Object.values(PRINT)].map((c) => c.toLowerCase()));

  it('writes only brand token colours in the HTML', () => {
    const hexes = [...mail.html.matchAll(/#[0-9a-f]{3,8}\b/gi)].map((m) => m[0].toLowerCase());
    expect(hexes.length).toBeGreaterThan(0);
    for (const hex of hexes) expect(tokens, hex).toContain(hex);
    expect(mail.html).not.toMatch(/\b(rgba?|hsla?|hwb|lab|lch|oklch|color)\(/i);
    expect(mail.html.toLowerCase()).not.toContain('#2f5d3a');
  });

  it('names no colour by keyword: every colour property holds a token', () => {
    const coloured = declarations(mail.html).filter(({ property }) =>
      /^(color|background|background-color|border(-\w+)*)$/.test(property),
    );
    expect(coloured.length).toBeGreaterThan(3);
    for (const { property, value } of coloured) {
      if (/^border/.test(property) && /^\d+px$/.test(value)) continue; // a radius or width
      const hex = /#[0-9a-f]{3,8}\b/i.exec(value)?.[0];
      expect(hex, `${property}: ${value}`).toBeDefined();
      expect(tokens).toContain(hex!.toLowerCase());
    }
  });

  it('draws the call to action in the brand green with its paired text colour', () => {
    const button = /<a [^>]*style="([^"]*)"/.exec(mail.html)?.[1] ?? '';
    expect(button).toContain(`background: ${PRINT.button}`);
    expect(button).toContain(`color: ${PRINT.onButton}`);
    expect(PRINT.button).toBe(BRAND);
  });

  it('escapes the words and keeps a text part with the link written out', () => {
    expect(mail.html).toContain('Your packet &lt;for&gt; &quot;North field&quot; is ready.');
    expect(mail.html).toContain('href="https://sheaf.test/sites/1/packet?a=1&amp;b=2"');
    expect(mail.text).toContain('Your packet <for> "North field" is ready.');
    expect(mail.text).toContain(
      'Open your field packet: https://sheaf.test/sites/1/packet?a=1&b=2',
    );
    expect(mail.text).toContain('Sent by Sheaf for your grower network.');
    expect(mail.text).not.toMatch(/[<>]p\b|style=/);
  });
});
