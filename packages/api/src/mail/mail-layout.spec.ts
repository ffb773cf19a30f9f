import { renderMail, wrap } from './mail-layout.js';

const content = {
  subject: '2027 Q1 is open <for> submissions',
  preheader: 'Send it by Friday',
  regionName: 'Ostrevale',
  greeting: 'Dear Priya "P" Calloway,',
  blocks: [
    { type: 'paragraph' as const, text: 'The audit quarter 2027 Q1 is now open & waiting.' },
    {
      type: 'facts' as const,
      rows: [
        { label: 'Practice', value: 'Quarrybank Surgery (OV102)' },
        { label: 'Submission deadline', value: 'Wednesday 16 June 2027' },
      ],
    },
    {
      type: 'action' as const,
      label: 'Upload your extract',
      url: 'https://cairn.example.org/extracts/upload',
      note: 'Sign-in needed.',
    },
    {
      type: 'caution' as const,
      title: 'Audit and improvement support',
      text: 'Not clinical advice.',
    },
  ],
  footer: ['You receive this as a practice lead.'],
};

describe('renderMail', () => {
  const mail = renderMail(content);

  it('writes HTML with inline styles only: no image, stylesheet, script or outside fetch', () => {
    expect(mail.html).toMatch(/^<!DOCTYPE html>/);
    expect(mail.html).not.toMatch(/<img\b|<link\b|<script\b|<style\b|url\(|@import|src=/i);
    expect(mail.html).toContain('role="presentation"');
    // Dark text on a light background
    expect(mail.html).toContain('color:#1c2127');
    expect(mail.html).toContain('background:#ffffff');
  });

  it('escapes every text it is given', () => {
    expect(mail.html).toContain('2027 Q1 is open &lt;for&gt; submissions');
    expect(mail.html).toContain('Dear Priya &quot;P&quot; Calloway,');
    expect(mail.html).toContain('open &amp; waiting.');
  });

  it('says the same in plain text, links written out in full', () => {
    expect(mail.text).toBe(
      [
        'Dear Priya "P" Calloway,',
        'The audit quarter 2027 Q1 is now open & waiting.',
        'Practice:            Quarrybank Surgery (OV102)\nSubmission deadline: Wednesday 16 June 2027',
        'Upload your extract:\nhttps://cairn.example.org/extracts/upload\nSign-in needed.',
        'Audit and improvement support. Not clinical advice.',
        '-- ',
        'You receive this as a practice lead.',
        'Cairn · Ostrevale',
      ].join('\n\n') + '\n',
    );
  });

  it('refuses a link that is not http(s)', () => {
    expect(() =>
      renderMail({
        ...content,
        blocks: [{ type: 'action', label: 'x', url: 'javascript:alert(1)' }],
      }),
    ).toThrow('refusing a javascript: link');
  });

  it('wraps plain text at 72 characters without cutting words', () => {
    const text = wrap(`${'word '.repeat(40)}https://cairn.example.org/${'a'.repeat(80)}`);
    for (const line of text.split('\n').slice(0, -1)) expect(line.length).toBeLessThanOrEqual(72);
    expect(text.split('\n').pop()).toMatch(/^https:\/\/cairn\.example\.org\/a{80}$/);
  });
});
