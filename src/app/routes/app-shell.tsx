import { RequireAuth } from '@/features/auth/components/require-auth';
import { AppLayout } from '../layout/app-layout';

/** Everything but sign-in sits inside this frame, and only for a signed-in user. */
export function Component() {
  return (
    <RequireAuth>
      <AppLayout />
    </RequireAuth>
  );
}
