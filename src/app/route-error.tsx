import type { ReactNode } from 'react';
import { isRouteErrorResponse, Link, useRevalidator, useRouteError } from 'react-router-dom';
import { buttonClasses, Button } from '@/components/ui/button';
import { ErrorMark } from '@/components/ui/form-field';

/** A lazy route's code failed to arrive: usually a new deployment replaced the old files. */
function isChunkLoadError(error: unknown): boolean {
  return (
    error instanceof Error &&
    /dynamically imported module|Importing a module script failed|error loading dynamically imported module|Failed to fetch/i.test(error.message)
  );
}

/**
 * Every route's errorElement. Inside the signed-in frame it replaces only the page, so the
 * navigation stays usable; "Try again" re-runs the route (and reloads if its code went missing).
 */
export function RouteError() {
  const error = useRouteError();
  const revalidator = useRevalidator();

  if (isRouteErrorResponse(error) && error.status === 404) {
    return (
      <ErrorFrame title="Page not found">
        <p>There is nothing at this address. Check the link, or start again from Home.</p>
      </ErrorFrame>
    );
  }

  const chunk = isChunkLoadError(error);
  const retry = () => (chunk ? window.location.reload() : revalidator.revalidate());

  return (
    <ErrorFrame title={chunk ? 'Rowpath was updated' : 'This screen ran into a problem'}>
      <p>
        {chunk
          ? 'Part of the app could not be loaded, usually because a newer version was just installed. Reloading fixes it.'
          : 'Nothing you entered was lost on the server. Try again; if it keeps happening, tell your administrator what you were doing.'}
      </p>
      {import.meta.env.DEV && error instanceof Error && (
        <pre className="mt-3 overflow-x-auto rounded bg-loam-100 p-3 text-sm text-ink-900">{error.stack ?? error.message}</pre>
      )}
      <div className="mt-5 flex flex-wrap gap-3">
        <Button onClick={retry} busy={revalidator.state === 'loading'}>
          {chunk ? 'Reload' : 'Try again'}
        </Button>
        <Link to="/" className={buttonClasses('secondary')}>
          Go to Home
        </Link>
      </div>
    </ErrorFrame>
  );
}

function ErrorFrame({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="mx-auto my-8 max-w-2xl px-4">
      <title>{`${title} · Rowpath`}</title>
      <div role="alert" className="rounded-xl border border-brick-300 bg-white p-6 shadow-sm">
        <h1 tabIndex={-1} data-page-title className="flex items-center gap-2 text-2xl font-bold text-ink-900">
          <ErrorMark className="mt-0 size-6 text-brick-700" />
          {title}
        </h1>
        <div className="mt-2 text-loam-800">{children}</div>
      </div>
    </div>
  );
}
