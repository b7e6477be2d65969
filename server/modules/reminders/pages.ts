// The small pages a grower sees after following a link in a reminder. Served by the API itself
// (no sign-in, no client bundle), in Rowpath's calm look: ink on loam, teal for done, brick for
// errors, each state also said in words. No scripts, no images.
import { escapeHtml } from '../../../shared/calc/merge-template.js';
import type { BookingContext } from './links.service.js';

const STYLE = `
body{margin:0;background:#f4f1ec;color:#22263a;font:17px/1.5 "Open Sans",Arial,Helvetica,sans-serif}
main{max-width:560px;margin:48px auto;padding:28px;background:#fff;border:1px solid #d9d2c7;border-radius:8px}
h1{font-size:24px;margin:0 0 12px;color:#2f3a6b}
.mark{display:block;font-weight:700;letter-spacing:.04em;color:#6b5f52;margin-bottom:18px}
.ok{border-left:6px solid #1f7a72;padding-left:12px}
.bad{border-left:6px solid #a1402e;padding-left:12px}
.note{border-left:6px solid #b7791f;padding-left:12px}
label{display:block;margin:14px 0 4px;font-weight:600}
input,textarea{width:100%;box-sizing:border-box;font:inherit;padding:10px;border:1px solid #b9b0a3;border-radius:4px}
button{margin-top:18px;font:inherit;font-weight:600;padding:12px 20px;min-height:48px;background:#2f3a6b;color:#fff;border:0;border-radius:4px;cursor:pointer}
small{color:#6b5f52}`;

export function page(title: string, inner: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta name="robots" content="noindex"><title>${escapeHtml(title)} · Rowpath</title><style>${STYLE}</style></head><body><main><span class="mark">ROWPATH · pre-season reminders</span>${inner}</main></body></html>`;
}

export function unsubscribedPage(o: { email: string | null; changed: boolean; test: boolean }): string {
  if (o.test) return page('Test link', `<div class="note"><h1>This was a test message</h1><p>Status: <strong>nothing changed</strong>. Links in test and preview messages do not unsubscribe anyone.</p></div>`);
  const who = o.email ? `<strong>${escapeHtml(o.email)}</strong>` : 'this contact';
  return page(
    'Unsubscribed',
    `<div class="ok"><h1>You are unsubscribed</h1><p>Status: <strong>done</strong>. ${who} will get no more pre-season reminders from your dealership${o.changed ? '' : ' (this was already the case)'}.</p></div>` +
      '<p><small>Changed your mind? Sign in to Rowpath and turn reminders back on under your preferences, or ask your specialist.</small></p>',
  );
}

export function bookingPage(token: string, ctx: BookingContext): string {
  const who = ctx.specialistName ? escapeHtml(ctx.specialistName) : 'your specialist';
  const intro = `<h1>Request a pre-season check-up</h1><p>For <strong>${escapeHtml(ctx.accountName)}</strong>, asked by ${escapeHtml(ctx.contactName)}. ${who} will call or write to agree a day.</p>`;
  if (ctx.existingVisitId) {
    return page('Check-up requested', `<div class="ok">${intro}<p>Status: <strong>already requested</strong>. A check-up request is on record; there is nothing more to do.</p></div>`);
  }
  const test = ctx.test ? '<p class="note">This is a test link: sending the form changes nothing.</p>' : '';
  return page(
    'Request a check-up',
    `${intro}${test}<form method="post" action="/api/reminders/book?token=${encodeURIComponent(token)}">` +
      '<label for="preferredDate">Preferred day (optional)</label><input id="preferredDate" name="preferredDate" type="date">' +
      '<label for="notes">Anything we should know? (optional)</label><textarea id="notes" name="notes" rows="3" maxlength="1000"></textarea>' +
      '<button type="submit">Request the check-up</button></form>',
  );
}

export function bookedPage(o: { created: boolean; test: boolean; context: BookingContext }): string {
  if (o.test) return page('Test link', `<div class="note"><h1>This was a test message</h1><p>Status: <strong>nothing changed</strong>. No visit was requested.</p></div>`);
  const who = o.context.specialistName ? escapeHtml(o.context.specialistName) : 'Your specialist';
  return page(
    'Check-up requested',
    `<div class="ok"><h1>Check-up requested</h1><p>Status: <strong>${o.created ? 'requested' : 'already requested'}</strong>. ${who} has your request for <strong>${escapeHtml(o.context.accountName)}</strong> and will be in touch to agree a day.</p></div>`,
  );
}

export function errorPage(message: string): string {
  return page('Link not valid', `<div class="bad"><h1>This link cannot be used</h1><p>Status: <strong>refused</strong>. ${escapeHtml(message)}</p></div>`);
}
