import { LogoMark } from '@/components/ui/logo';
import { Spinner } from '@/components/ui/spinner';

/** Shown while the first screen's code arrives (lazy routes on a cold load). */
export function RouteFallback() {
  return (
    <div className="flex min-h-dvh flex-col items-center justify-center gap-4 bg-loam-50" role="status">
      <LogoMark className="size-14" />
      <p className="flex items-center gap-2 text-loam-700">
        <Spinner className="size-5" /> Loading Rowpath…
      </p>
    </div>
  );
}
