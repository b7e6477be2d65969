import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { Navigate, useLocation, useNavigate } from 'react-router-dom';
import { z } from 'zod';
import { loginSchema } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormAlert, TextField } from '@/components/ui/form-field';
import { Logo, LogoMark } from '@/components/ui/logo';
import { ApiError, isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { useLoginMutation } from '../api/login';
import { meQueryOptions } from '../api/me';

// The contract's rules (shared), plus a plain "enter it" message when a field is left empty.
const signInSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(loginSchema.shape.email),
  password: loginSchema.shape.password,
});
type SignInValues = z.input<typeof signInSchema>;

/** Only same-site paths are followed after sign-in, never another origin. */
function safeReturnPath(value: unknown): string {
  return typeof value === 'string' && value.startsWith('/') && !value.startsWith('//') && !value.startsWith('/sign-in')
    ? value
    : '/';
}

function formatWait(totalSeconds: number): string {
  const minutes = Math.floor(totalSeconds / 60);
  const seconds = totalSeconds % 60;
  if (minutes === 0) return `${seconds} s`;
  return seconds === 0 ? `${minutes} min` : `${minutes} min ${seconds} s`;
}

/** Seconds left until `untilMs`, ticking once a second; 0 once passed (or when there is no wait). */
function useSecondsUntil(untilMs: number | null): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (untilMs === null) return;
    setNow(Date.now());
    const timer = window.setInterval(() => setNow(Date.now()), 1000);
    return () => window.clearInterval(timer);
  }, [untilMs]);
  return untilMs === null ? 0 : Math.max(0, Math.ceil((untilMs - now) / 1000));
}

export function SignInPage() {
  const location = useLocation();
  const navigate = useNavigate();
  const returnTo = safeReturnPath((location.state as { from?: unknown } | null)?.from);
  const me = useQuery(meQueryOptions());
  const loginMutation = useLoginMutation();
  const [serverError, setServerError] = useState<ApiError | null>(null);
  const [blockedUntilMs, setBlockedUntilMs] = useState<number | null>(null);
  const secondsLeft = useSecondsUntil(blockedUntilMs);
  const blocked = secondsLeft > 0;

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<SignInValues>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  const [showPassword, setShowPassword] = useState(false);

  if (me.data) return <Navigate to={returnTo} replace />;

  const onSubmit = handleSubmit((values) => {
    // While paused the button stays focusable (keyboard users keep their place) but sends nothing.
    if (blocked) return;
    setServerError(null);
    loginMutation.mutate(
      { email: values.email.trim().toLowerCase(), password: values.password },
      {
        onSuccess: () => navigate(returnTo, { replace: true }),
        onError: (error) => {
          if (!isApiError(error)) {
            setServerError(new ApiError({ status: 500, code: 'unexpected', message: 'unexpected answer' }));
            return;
          }
          if (error.status === 400 && Object.keys(error.fields).length > 0) {
            for (const [field, message] of Object.entries(error.fields)) {
              if (field === 'email' || field === 'password') setError(field, { message }, { shouldFocus: true });
            }
            return;
          }
          if (error.status === 429) setBlockedUntilMs(Date.now() + (error.retryAfterSeconds ?? 60) * 1000);
          setServerError(error);
        },
      },
    );
  });

  return (
    <div className="min-h-dvh bg-loam-100 lg:grid lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
      <title>Sign in · Rowpath</title>
      {/* Brand panel: wide screens only; the form stands alone on a phone or a tablet in portrait. */}
      <aside aria-label="About Rowpath" className="relative hidden overflow-hidden bg-ink-900 p-12 text-ink-100 lg:flex lg:flex-col lg:justify-between">
        <Logo />
        <div className="relative z-10 max-w-md">
          <p className="text-3xl leading-tight font-bold text-white">Every fleet, every roadmap, every visit — row by row.</p>
          <p className="mt-4 text-lg text-ink-200">
            Planter records, multi-season upgrade plans, farm visits and pre-season reminders for your territory.
          </p>
        </div>
        <FieldRows />
      </aside>

      <main className="flex min-h-dvh items-center justify-center px-4 py-10 sm:px-8 lg:min-h-0">
        <div className="w-full max-w-md">
          <div className="mb-8 flex items-center gap-3 lg:hidden">
            <LogoMark className="size-11" />
            <span className="text-2xl font-bold text-ink-900">Rowpath</span>
          </div>
          <div className="rounded-2xl border border-loam-200 bg-white p-6 shadow-sm sm:p-8">
            <h1 className="text-2xl font-bold text-ink-900">Sign in</h1>
            <p className="mt-1 text-loam-700">Use the e-mail address your dealership set up for you.</p>

            <form className="mt-6 space-y-5" onSubmit={onSubmit} noValidate aria-label="Sign in">
              {serverError && (
                <FormAlert>
                  {serverError.status === 429 ? (
                    <>
                      <p className="font-semibold">Sign-in is paused after too many attempts.</p>
                      <p aria-live="off">
                        {blocked
                          ? `Try again in ${formatWait(secondsLeft)}.`
                          : 'You can try again now.'}
                      </p>
                    </>
                  ) : serverError.status === 401 ? (
                    <p>{serverError.message}</p>
                  ) : serverError.status === 0 ? (
                    <p>{serverError.message}</p>
                  ) : (
                    <p>Sign-in did not work this time ({serverError.message}). Try again in a moment.</p>
                  )}
                </FormAlert>
              )}

              <TextField
                label="E-mail"
                type="email"
                autoComplete="username"
                inputMode="email"
                spellCheck={false}
                autoFocus
                error={errors.email?.message}
                {...register('email')}
              />

              <div>
                <TextField
                  label="Password"
                  type={showPassword ? 'text' : 'password'}
                  autoComplete="current-password"
                  error={errors.password?.message}
                  {...register('password')}
                />
                <button
                  type="button"
                  className="mt-1 -ml-2 inline-flex min-h-11 items-center rounded px-2 font-semibold text-ink-700 underline-offset-2 hover:underline"
                  aria-pressed={showPassword}
                  onClick={() => setShowPassword((shown) => !shown)}
                >
                  Show password
                </button>
              </div>

              <Button
                type="submit"
                className={cn('w-full text-lg', blocked && 'cursor-not-allowed opacity-60')}
                busy={loginMutation.isPending}
                aria-disabled={blocked || undefined}
              >
                {loginMutation.isPending ? 'Signing in…' : 'Sign in'}
              </Button>
            </form>
          </div>
          <p className="mt-6 text-center text-sm text-loam-700">
            No account, or locked out? Ask your dealership&apos;s Rowpath administrator.
          </p>
        </div>
      </main>
    </div>
  );
}

/** Faint planted rows along the bottom of the brand panel. */
function FieldRows() {
  return (
    <svg viewBox="0 0 400 160" className="absolute inset-x-0 bottom-0 w-full text-ink-700" aria-hidden="true" preserveAspectRatio="none">
      {Array.from({ length: 9 }, (_, i) => (
        <path key={i} d={`M${-40 + i * 60} 160 L${60 + i * 40} 0`} stroke="currentColor" strokeWidth="5" strokeDasharray="6 10" strokeLinecap="round" />
      ))}
      <path d="M-10 150 C 120 120, 160 60, 410 40" fill="none" stroke="#564c41" strokeWidth="14" strokeLinecap="round" opacity="0.6" />
    </svg>
  );
}
