import { describe, expect, it } from 'vitest';
import {
  checkTemplate,
  MERGE_FIELD_NAMES,
  PRE_SEASON_CHECKLIST,
  renderTemplate,
  sampleMergeValues,
  templateProblems,
  type MergeValues,
} from '@shared/calc/merge-template';

const links = { bookingLink: 'http://127.0.0.1:3000/api/reminders/book?token=b.1', unsubscribeLink: 'http://127.0.0.1:3000/api/reminders/unsubscribe?token=u.1' };
const values = (over: Partial<MergeValues> = {}): MergeValues => ({ ...sampleMergeValues(links), ...over });

describe('template checks at save time', () => {
  it('when a template uses only known fields, then there is nothing to refuse', () => {
    expect(templateProblems({ subject: 'Check-up before {{season}}, {{grower.firstName}}', body: 'Hi {{ grower.name }},\n\n{{checklist}}\n\n{{bookingLink}}' })).toEqual({});
  });

  it('when the body uses an unknown field, then the problem names it', () => {
    const problems = templateProblems({ subject: 'Hello', body: 'Hi {{grower.nmae}}, see {{planters}} and {{rodmapItems}}' });
    expect(problems.body).toMatch(/Unknown merge fields \{\{grower\.nmae\}\}, \{\{rodmapItems\}\}/);
    expect(problems.subject).toBeUndefined();
    expect(checkTemplate('{{a}} {{b}} {{a}}').unknownFields).toEqual(['a', 'b']);
  });

  it('when the subject uses an unknown field or a link, then the subject is refused', () => {
    expect(templateProblems({ subject: 'For {{farm}}', body: 'x' }).subject).toMatch(/\{\{farm\}\}/);
    expect(templateProblems({ subject: 'Book {{bookingLink}}', body: 'x' }).subject).toMatch(/text fields only/);
  });

  it('when a brace is left open, then the template is refused as malformed', () => {
    expect(templateProblems({ subject: 'Hi', body: 'Hi {{grower.name}, welcome' }).body).toMatch(/not closed/);
    expect(templateProblems({ subject: 'Hi }}', body: 'x' }).subject).toMatch(/not closed/);
  });

  it('when rendering a template that was never checked, then an unknown field throws instead of reaching a grower', () => {
    expect(() => renderTemplate({ subject: 'Hi', body: '{{nope}}' }, values())).toThrow(/nope/);
  });
});

describe('rendering a reminder', () => {
  const template = {
    subject: 'Pre-season check-up, {{account.name}} ({{season}})',
    body: 'Hello {{grower.firstName}},\n\nYour planters:\n\n{{planters}}\n\nPlanned this season: {{roadmapItems}}\n\n{{checklist}}\n\n{{bookingLink}}',
  };

  it('when a grower is filled in, then subject, text and HTML carry their values and the lists', () => {
    const m = renderTemplate(template, values({ planters: ['24-row planter', '12-row planter'], roadmapItems: ['Electric drives × 24', 'Downforce × 24'] }));
    expect(m.subject).toBe('Pre-season check-up, Sample Family Farms (2027)');
    expect(m.text).toContain('Hello Avery,');
    expect(m.text).toContain('  - 24-row planter\n  - 12-row planter');
    expect(m.text).toContain('Planned this season: Electric drives × 24 and Downforce × 24');
    expect(m.text).toContain(`Request a pre-season check-up: ${links.bookingLink}`);
    expect(m.html).toContain('<li>24-row planter</li><li>12-row planter</li>');
    expect(m.html).toContain(`href="${links.bookingLink}"`);
  });

  it('when a list is empty, then its own words say so rather than leaving a gap', () => {
    const m = renderTemplate(template, values({ roadmapItems: [], planters: [] }));
    expect(m.text).toContain('Planned this season: No upgrades are planned for this season.');
    expect(m.text).toContain('No planters are on record yet.');
  });

  it('when the body has no unsubscribe link, then a footer with one is added to both parts', () => {
    const m = renderTemplate(template, values());
    expect(m.text).toContain(links.unsubscribeLink);
    expect(m.html).toContain(`href="${links.unsubscribeLink}"`);
    const own = renderTemplate({ subject: 's', body: 'Bye: {{unsubscribeLink}}' }, values());
    expect(own.text.split(links.unsubscribeLink).length - 1).toBe(1);
  });

  it('when a value holds markup, then the HTML escapes it and carries no image, script or remote resource', () => {
    const m = renderTemplate(template, values({ 'account.name': '<img src=http://x/p.gif>', 'grower.firstName': '"Sam" & <b>co</b>' }));
    expect(m.html).not.toMatch(/<img|<script|src=/i);
    expect(m.html).toContain('&quot;Sam&quot; &amp; &lt;b&gt;co&lt;/b&gt;');
    expect(m.subject).toBe('Pre-season check-up, <img src=http://x/p.gif> (2027)'); // subjects are plain text
  });

  it('when a link is not a web address, then it is not placed in the HTML', () => {
    const m = renderTemplate({ subject: 's', body: '{{bookingLink}}' }, values({ bookingLink: 'javascript:alert(1)' }));
    expect(m.html).not.toContain('javascript:');
  });

  it('when the checklist is used, then it lists disc wear at 14.5 in, meter calibration, hoses and fittings and display software', () => {
    // Opener disc wear: 15-in discs replaced at about 14.5 in (common practice; Penn State Extension, REFERENCES.md).
    expect(PRE_SEASON_CHECKLIST[0]).toMatch(/15-in discs worn to 14\.5 in/);
    expect(PRE_SEASON_CHECKLIST.join(' ')).toMatch(/calibration/);
    expect(PRE_SEASON_CHECKLIST.join(' ')).toMatch(/Hoses and fittings/);
    expect(PRE_SEASON_CHECKLIST.join(' ')).toMatch(/software/);
    const m = renderTemplate({ subject: 's', body: '{{checklist}}' }, values());
    expect(m.html.match(/<li>/g)).toHaveLength(PRE_SEASON_CHECKLIST.length);
  });

  it('when every known field is used, then none is left unfilled', () => {
    const body = MERGE_FIELD_NAMES.map((f) => `${f}: {{${f}}}`).join('\n\n');
    const m = renderTemplate({ subject: 'x', body }, values());
    expect(m.text).not.toMatch(/\{\{|\}\}|undefined/);
  });
});

describe('the HTML part as a page of its own', () => {
  it('when a reminder is rendered, then its HTML names its language and has a title', () => {
    const out = renderTemplate({ subject: 'Check-up', body: 'Hello {{grower.firstName}}.' }, sampleMergeValues(links));
    expect(out.html).toContain('<html lang="en">');
    expect(out.html).toContain('<title>A reminder from your dealership</title>');
  });
});
