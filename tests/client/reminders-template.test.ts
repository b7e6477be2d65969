import { describe, expect, it } from 'vitest';
import { MERGE_FIELD_NAMES, renderTemplate, sampleMergeValues } from '@shared/calc/merge-template';
import { parseAddress, splitAtSign } from '@/features/reminders/model/address';
import { insertMergeField, liveTemplateCheck, SUBJECT_FIELDS, usedMergeFields } from '@/features/reminders/model/template';

describe('inserting a merge field where the cursor is', () => {
  it('when a text field is picked mid-sentence, then it goes in at the cursor and the cursor lands after it', () => {
    const r = insertMergeField('Hello , ready?', 6, 6, 'grower.firstName');
    expect(r.text).toBe('Hello {{grower.firstName}}, ready?');
    expect(r.cursor).toBe(6 + '{{grower.firstName}}'.length);
  });

  it('when text is selected, then the field replaces the selection', () => {
    expect(insertMergeField('Hello NAME!', 6, 10, 'grower.name').text).toBe('Hello {{grower.name}}!');
  });

  it('when a list field is picked inside a paragraph, then it is set apart by blank lines so it renders as a bulleted list', () => {
    const r = insertMergeField('Your planters:\nSee you soon.', 15, 15, 'planters');
    expect(r.text).toBe('Your planters:\n\n{{planters}}\n\nSee you soon.');
    // The renderer turns the lone field into a list: each planter is its own item.
    const html = renderTemplate({ subject: 'x', body: r.text }, { ...sampleMergeValues({ bookingLink: 'http://a.test/b', unsubscribeLink: 'http://a.test/u' }), planters: ['A', 'B'] }).html;
    expect(html).toContain('<ul');
    expect(html).toContain('<li>A</li><li>B</li>');
  });

  it('when a link is added at the very end of a message, then only the blank line before it is added', () => {
    const body = 'Book here:';
    expect(insertMergeField(body, body.length, body.length, 'bookingLink').text).toBe('Book here:\n\n{{bookingLink}}');
  });

  it('when the cursor is beyond the text (a stale position), then the field goes at the end', () => {
    expect(insertMergeField('Hi ', 99, 120, 'season').text).toBe('Hi {{season}}');
  });
});

describe('checking a template as it is typed', () => {
  it('when the body names an unknown field, then the check names it as the server would', () => {
    const check = liveTemplateCheck('Hello {{grower.firstName}}', 'Dear {{grower.nmae}}, your {{tractor}}');
    expect(check.unknownFields).toEqual(['grower.nmae', 'tractor']);
    expect(check.body).toMatch(/^Unknown merge fields \{\{grower\.nmae\}\}, \{\{tractor\}\}\./);
    expect(check.subject).toBeUndefined();
  });

  it('when a brace is left open, then the body is refused with the way to write a field', () => {
    expect(liveTemplateCheck('Hi', 'Hello {{grower.name}').body).toMatch(/not closed/);
  });

  it('when a list or a link is put in the subject, then the subject is refused', () => {
    expect(liveTemplateCheck('Your {{planters}}', 'Body').subject).toMatch(/text fields only/);
  });

  it('when the template uses only known fields, then nothing is reported', () => {
    expect(liveTemplateCheck('{{grower.firstName}}, {{season}}', 'Hi\n\n{{checklist}}\n\n{{bookingLink}}')).toEqual({ unknownFields: [] });
  });

  it('when the subject picker is offered, then it holds the text fields only', () => {
    expect(SUBJECT_FIELDS).toContain('grower.firstName');
    expect(SUBJECT_FIELDS).not.toContain('planters');
    expect(SUBJECT_FIELDS).not.toContain('bookingLink');
    expect(SUBJECT_FIELDS.length).toBeLessThan(MERGE_FIELD_NAMES.length);
  });

  it('when a template is read for the fields it uses, then known ones are listed once in order and unknown ones are left out', () => {
    expect(usedMergeFields('{{season}} {{grower.name}} {{season}} {{nope}} {{ checklist }}')).toEqual(['season', 'grower.name', 'checklist']);
  });
});

describe('addresses on the Sent mail page', () => {
  it('when a header carries a quoted display name, then the name and the address are read apart', () => {
    expect(parseAddress('"Rowpath reminders" <reminders@rowpath.test>')).toEqual({ name: 'Rowpath reminders', email: 'reminders@rowpath.test' });
    expect(parseAddress('Odette Vossberg <odette@growers.rowpath.test>')).toEqual({ name: 'Odette Vossberg', email: 'odette@growers.rowpath.test' });
    expect(parseAddress('odette@growers.rowpath.test')).toEqual({ name: null, email: 'odette@growers.rowpath.test' });
    expect(splitAtSign('pruitt.zeigenbein40@growers.rowpath.test')).toEqual(['pruitt.zeigenbein40', '@growers.rowpath.test']);
    expect(splitAtSign('no-at-sign')).toEqual(['no-at-sign', '']);
  });
});
