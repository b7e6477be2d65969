import { useQuery } from '@tanstack/react-query';
import { Link, useLocation, useParams } from 'react-router-dom';
import { ErrorState, LoadingBlock } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDateTime } from '@/features/fleet/lib/labels';
import { MailView } from '@/features/reminders/components/mail-view';
import { isApiError } from '@/lib/api';
import { parseAddress } from '@/features/reminders/model/address';
import { sentMailQueryOptions } from '../api/sent-mail';

/** 'Name <address>' without the quotes a header carries. */
function readable(header: string | null): string {
  if (!header) return '—';
  const { name, email } = parseAddress(header);
  return name ? `${name} <${email}>` : email;
}

export function parseMailId(value: string | undefined): number | null {
  if (!value || !/^\d{1,12}$/.test(value)) return null;
  const id = Number(value);
  return id >= 1 ? id : null;
}

/** Admin: one received message, as the person it was sent to would read it. */
export function SentMailMessagePage() {
  const id = parseMailId(useParams().mailId);
  const location = useLocation();
  const back = `/sent-mail${(location.state as { fromList?: string } | null)?.fromList ?? ''}`;
  const mail = useQuery({ ...sentMailQueryOptions(id ?? 0), enabled: id !== null });

  const backLink = (
    <Link to={back} className="mb-3 inline-flex min-h-11 items-center gap-1 font-semibold text-ink-700 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-800">
      <span aria-hidden="true">‹</span> Sent mail
    </Link>
  );
  if (id === null) return (<>{backLink}<ErrorState title="There is no message at this address" /></>);
  if (mail.isPending) return (<>{backLink}<LoadingBlock label="Loading the message…" /></>);
  if (mail.isError) {
    return (
      <>
        {backLink}
        <ErrorState
          title={isApiError(mail.error) && mail.error.status === 404 ? 'That message is not in the mailbox' : 'The message could not be loaded'}
          message={mail.error.message}
          onRetry={() => void mail.refetch()}
          retrying={mail.isFetching}
        />
      </>
    );
  }
  const m = mail.data;
  const isTest = Boolean(m.headers['x-rowpath-test']) || m.subject?.startsWith('[Test]');
  return (
    <>
      <title>{`${m.subject ?? 'Message'} · Sent mail · Rowpath`}</title>
      {backLink}
      <article className="rounded-xl border border-loam-200 bg-white shadow-sm" aria-labelledby="mail-subject" data-sent-message={m.id}>
        <header className="border-b border-loam-200 px-5 py-4">
          <h1 id="mail-subject" tabIndex={-1} data-page-title className="text-2xl font-bold text-ink-900 outline-none">
            {m.subject ?? '(no subject)'}
          </h1>
          {isTest && (
            <p className="mt-1">
              <StatusBadge tone="info" shape="ring">
                Test message
              </StatusBadge>
            </p>
          )}
          <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
            <dt className="font-semibold text-loam-800">From</dt>
            <dd className="break-words" data-mail-from>{readable(m.from ?? m.envelopeFrom)}</dd>
            <dt className="font-semibold text-loam-800">To</dt>
            <dd className="break-words" data-mail-to>{m.to ? readable(m.to) : m.envelopeTo.join(', ')}</dd>
            <dt className="font-semibold text-loam-800">Received</dt>
            <dd>{formatDateTime(m.receivedAt)}</dd>
            {m.repeatCount > 1 && (
              <>
                <dt className="font-semibold text-loam-800">Arrived</dt>
                <dd>{m.repeatCount} times with the same Message-ID; a mail program shows it once.</dd>
              </>
            )}
          </dl>
          <details className="mt-2 text-sm text-loam-700">
            <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold">All headers</summary>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-0.5 pb-2">
              {Object.entries(m.headers).map(([key, value]) => (
                <div key={key} className="contents">
                  <dt className="font-mono">{key}</dt>
                  <dd className="font-mono break-all">{value}</dd>
                </div>
              ))}
            </dl>
          </details>
        </header>
        <div className="px-5 py-4">
          <MailView html={m.html} text={m.text} title={`The message “${m.subject ?? ''}” as received`} frameHeight={720} />
        </div>
      </article>
    </>
  );
}
