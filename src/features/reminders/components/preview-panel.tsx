import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { FormAlert, inputClasses } from '@/components/ui/form-field';
import { LoadingBlock } from '@/components/ui/states';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { Notice } from '@/features/fleet/components/form-bits';
import { isApiError } from '@/lib/api';
import { audienceQueryOptions, type Campaign } from '../api/reminders';
import { previewQueryOptions } from '../api/preview-campaign';
import { useTestSendMutation } from '../api/test-send';
import { daysBeforeLabel, plural } from '../model/labels';
import { liveTemplateCheck } from '../model/template';
import { formatIsoDay } from '../model/season';
import { EmailText } from './email-text';
import { MailView } from './mail-view';

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const timer = window.setTimeout(() => setDebounced(value), ms);
    return () => window.clearTimeout(timer);
  }, [value, ms]);
  return debounced;
}

/**
 * One grower's message as they will read it, made by the server from the template as typed
 * (saved or not) and the campaign's saved season, window and audience. Links in a preview are
 * marked as a test: following them changes nothing.
 */
export function PreviewPanel({ campaign, subject, body, templateOk, dirty }: { campaign: Campaign; subject: string; body: string; templateOk: boolean; dirty: boolean }) {
  const user = useCurrentUser();
  const audience = useQuery(audienceQueryOptions(campaign.id));
  const [contactId, setContactId] = useState<number | null>(null);
  const selectId = useId();
  const chosen = contactId ?? audience.data?.items[0]?.contactId ?? null;

  // The template as typed, once typing pauses and only while it is valid; else the last good one.
  const [lastGood, setLastGood] = useState({ subject: campaign.subject, body: campaign.body });
  const typedSubject = useDebounced(subject, 500);
  const typedBody = useDebounced(body, 500);
  const typedCheck = liveTemplateCheck(typedSubject, typedBody);
  const typedOk = !typedCheck.subject && !typedCheck.body && typedSubject.trim().length > 0 && typedBody.trim().length > 0;
  useEffect(() => {
    if (typedOk) setLastGood({ subject: typedSubject, body: typedBody });
  }, [typedSubject, typedBody, typedOk]);
  const useStored = lastGood.subject === campaign.subject && lastGood.body === campaign.body;
  const preview = useQuery({
    ...previewQueryOptions(campaign.id, { contactId: chosen ?? 0, ...(useStored ? {} : lastGood) }),
    enabled: chosen !== null,
    placeholderData: (previous) => previous,
  });

  const testSend = useTestSendMutation(campaign.id);
  const [to, setTo] = useState(user.email);
  const [notice, setNotice] = useState<string | null>(null);
  const testSendFieldError = isApiError(testSend.error) ? testSend.error.fields.to : undefined;
  const sendTest = () => {
    if (chosen === null || testSend.isPending) return;
    setNotice(null);
    testSend.mutate(
      { contactId: chosen, to: to.trim() || undefined },
      { onSuccess: (r) => setNotice(`Test sent to ${r.to}, marked [Test]. Its links change nothing.${user.role === 'admin' ? ' It shows on the Sent mail page.' : ''}`) },
    );
  };

  return (
    <section aria-labelledby="preview-title" className="rounded-xl border border-loam-200 bg-white p-5 shadow-sm" data-preview-panel>
      <h2 id="preview-title" className="text-xl font-bold text-ink-900">
        Preview for a grower
      </h2>
      <p className="mt-1 text-loam-700">
        As the grower will read it.{dirty ? ' Uses the subject and message as typed; other changes show once saved.' : ''}
      </p>
      {audience.isPending ? (
        <LoadingBlock label="Loading the audience…" />
      ) : audience.isError ? (
        <FormAlert>{audience.error.message}</FormAlert>
      ) : audience.data.items.length === 0 ? (
        <p className="mt-3 rounded-lg bg-amber-50 px-4 py-3 text-amber-800">
          <span aria-hidden="true">▲ </span>Nobody is in this campaign’s audience yet. Widen the audience (territories, crop, check-up date) and save to preview.
        </p>
      ) : (
        <>
          <div className="mt-3">
            <label htmlFor={selectId} className="mb-1 block font-semibold text-ink-900">
              Preview for
            </label>
            <select id={selectId} className={inputClasses} value={chosen ?? ''} onChange={(e) => setContactId(Number(e.target.value))} data-preview-contact>
              {audience.data.items.map((c) => (
                <option key={c.contactId} value={c.contactId}>
                  {c.contactName} — {c.accountName}
                </option>
              ))}
            </select>
            <p className="mt-1 text-sm text-loam-700" data-audience-total={audience.data.total}>
              {plural(audience.data.total, 'contact')} in the audience today{audience.data.total > audience.data.items.length ? ` (the first ${audience.data.items.length} are listed)` : ''}.
            </p>
          </div>
          {!templateOk && <p className="mt-3 text-amber-800"><span aria-hidden="true">▲ </span>Fix the template to refresh the preview; the last good version shows.</p>}
          {preview.isError ? (
            <div className="mt-3">
              <FormAlert>{preview.error.message}</FormAlert>
            </div>
          ) : !preview.data ? (
            <LoadingBlock label="Making the preview…" />
          ) : (
            <div className={preview.isFetching ? 'opacity-70' : undefined} aria-busy={preview.isFetching} data-preview>
              <dl className="mt-4 grid grid-cols-[max-content_minmax(0,1fr)] gap-x-3 gap-y-1 rounded-lg bg-loam-50 px-4 py-3">
                <dt className="font-semibold text-loam-800">To</dt>
                <dd data-preview-to>
                  <span className="block">{preview.data.contact.name}</span>
                  {preview.data.to ? <EmailText email={preview.data.to} className="block text-loam-800" /> : <span className="block text-brick-700">No e-mail address</span>}
                </dd>
                <dt className="font-semibold text-loam-800">Subject</dt>
                <dd className="font-semibold text-ink-950" data-preview-subject>
                  {preview.data.subject}
                </dd>
                <dt className="font-semibold text-loam-800">Reminder</dt>
                <dd>
                  {daysBeforeLabel(preview.data.offsetDays)} the window, goes out {formatIsoDay(preview.data.sendOn)}
                </dd>
              </dl>
              {!preview.data.inAudience && (
                <div className="mt-3" data-not-in-audience>
                  <FormAlert tone="warning">
                    <p className="font-semibold">{preview.data.contact.name} would not be sent this campaign:</p>
                    <ul className="list-disc pl-5">
                      {preview.data.notInAudienceBecause.map((r) => (
                        <li key={r}>{r}</li>
                      ))}
                    </ul>
                  </FormAlert>
                </div>
              )}
              <div className="mt-4">
                <MailView html={preview.data.html} text={preview.data.text} title={`Preview of the message to ${preview.data.contact.name}`} />
              </div>
            </div>
          )}
          {/* Not a <form>: the panel sits inside the campaign form, and forms do not nest. */}
          <div className="mt-5 border-t border-loam-200 pt-4" role="group" aria-labelledby={`${selectId}-test-title`}>
            <h3 id={`${selectId}-test-title`} className="font-semibold text-ink-900">
              Send a test
            </h3>
            <p className="text-sm text-loam-700">This grower’s message, from the saved template, to an address of yours. Nothing goes in the outbox.</p>
            <div className="mt-2 flex flex-wrap items-end gap-2">
              <div className="min-w-60 flex-1">
                <label htmlFor={`${selectId}-to`} className="mb-1 block font-semibold text-ink-900">
                  Send the test to
                </label>
                <input
                  id={`${selectId}-to`}
                  type="email"
                  className={inputClasses}
                  value={to}
                  onChange={(e) => setTo(e.target.value)}
                  onKeyDown={(e) => {
                    if (e.key === 'Enter') {
                      e.preventDefault();
                      sendTest();
                    }
                  }}
                  aria-invalid={testSendFieldError ? true : undefined}
                />
              </div>
              <Button variant="secondary" busy={testSend.isPending} onClick={sendTest}>
                {testSend.isPending ? 'Sending…' : 'Send a test'}
              </Button>
            </div>
            {testSend.isError && (
              <div className="mt-3">
                <FormAlert>{testSendFieldError ?? testSend.error.message}</FormAlert>
              </div>
            )}
            <Notice message={notice} onDone={() => setNotice(null)} className="mt-3" />
          </div>
        </>
      )}
    </section>
  );
}
