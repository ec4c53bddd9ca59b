import { Redirect, Slot, useGlobalSearchParams } from 'expo-router';
import { safeReturnPath } from '../../components/auth/return-path';
import { useSession } from '../../components/data/session';
import { CenteredMessage } from '../../components/ui/CenteredMessage';

/** Signed-in people have no business on the sign-in page: send them on (to `next` if given). */
export default function AuthLayout() {
  const { status } = useSession();
  const { next } = useGlobalSearchParams<{ next?: string }>();
  if (status === 'loading') return <CenteredMessage busy testID="session-loading" />;
  if (status === 'signed-in') return <Redirect href={safeReturnPath(next)} />;
  return <Slot />;
}
