import { Redirect, Slot, usePathname } from 'expo-router';
import { useSession } from '../../components/data/session';
import { AppShell } from '../../components/shell/AppShell';
import { Button } from '../../components/ui/Button';
import { CenteredMessage } from '../../components/ui/CenteredMessage';

/** The guard of every signed-in screen: signed out → /sign-in (coming back here after). */
export default function AppLayout() {
  const { status, current, refetch, error } = useSession();
  const pathname = usePathname();

  if (status === 'loading') return <CenteredMessage busy testID="session-loading" />;
  if (status === 'error') {
    return (
      <CenteredMessage testID="session-error" title="Samplewright cannot reach its server" text={error?.message}>
        <Button label="Try again" onPress={refetch} />
      </CenteredMessage>
    );
  }
  if (status === 'signed-out') {
    return <Redirect href={pathname && pathname !== '/' ? { pathname: '/sign-in', params: { next: pathname } } : '/sign-in'} />;
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
