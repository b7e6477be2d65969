import { useNavigate } from 'react-router-dom';
import { cn } from '@/lib/cn';
import { useLogoutMutation } from '../api/logout';

/** Ends the session on the server, clears every cached answer, then shows the sign-in page. */
export function SignOutButton({ className }: { className?: string }) {
  const navigate = useNavigate();
  const logout = useLogoutMutation();
  return (
    <div>
      <button
        type="button"
        className={cn(
          'inline-flex min-h-11 w-full items-center justify-center gap-2 rounded-lg border px-4 font-semibold disabled:opacity-60',
          className,
        )}
        disabled={logout.isPending}
        onClick={() => logout.mutate(undefined, { onSuccess: () => navigate('/sign-in', { replace: true }) })}
      >
        <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round">
          <path d="M8 4H4.5A1.5 1.5 0 0 0 3 5.5v9A1.5 1.5 0 0 0 4.5 16H8M13 13.5 16.5 10 13 6.5M16.5 10H7.5" />
        </svg>
        {logout.isPending ? 'Signing out…' : 'Sign out'}
      </button>
      {logout.isError && (
        <p role="alert" className="mt-2 text-sm font-semibold">
          Sign-out did not reach the server. Try again.
        </p>
      )}
    </div>
  );
}
