import { useRef } from 'react';
import { Redirect, Slot, usePathname } from 'expo-router';
import { useSession } from '../../components/data/session';
import { AppShell } from '../../components/shell/AppShell';
import { Button } from '../../components/ui/Button';
import { CenteredMessage } from '../../components/ui/CenteredMessage';

/** The guard of every signed-in screen: signed out → /sign-in (coming back here after). */
export default function AppLayout() {
  const { status, current, refetch, error } = useSession();
  const pathname = usePathname();
  // While this layout renders no <Slot />, Expo Router on the web rewrites the URL to the
  // group's index route, so the path to come back to is the first one seen, or the last
  // one shown while signed in (when the session ends on its own).
  const requested = useRef(pathname);
  if (status === 'signed-in') requested.current = pathname;

  if (status === 'error') {
    return (
      <CenteredMessage testID="session-error" title="Samplewright cannot reach its server" text={error?.message}>
        <Button label="Try again" onPress={refetch} />
      </CenteredMessage>
    );
  }
  if (status !== 'signed-in') {
    const next = requested.current;
    return <Redirect href={next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'} />;
  }
  if (!current) {
    return (
      <CenteredMessage
        testID="no-workspace"
        title="You are not in a workspace yet"
        text="Ask an owner of your team's workspace to add you by your e-mail address, then sign in again."
      />
    );
  }
  return (
    <AppShell>
      <Slot />
    </AppShell>
  );
}

export { ErrorScreen as ErrorBoundary } from '../../components/ErrorScreen';
