import { useState, type ReactNode } from 'react';
import { Slot } from 'expo-router';
import { useFonts } from 'expo-font';
import { StatusBar } from 'expo-status-bar';
import { QueryClientProvider } from '@tanstack/react-query';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { createQueryClient } from '../components/data/query-client';
import { SessionProvider, handleUnauthorized, useSession } from '../components/data/session';
import { CenteredMessage } from '../components/ui/CenteredMessage';
import { theme } from '../components/theme';

/** Every provider of the app, in one place; the route groups below decide what is shown. */
export default function RootLayout() {
  const [fontsLoaded, fontError] = useFonts({
    [theme.font.regular]: require('../assets/fonts/Inter_400Regular.ttf'),
    [theme.font.medium]: require('../assets/fonts/Inter_500Medium.ttf'),
    [theme.font.bold]: require('../assets/fonts/Inter_700Bold.ttf'),
    [theme.font.mono]: require('../assets/fonts/JetBrainsMono_400Regular.ttf'),
  });
  const [queryClient] = useState(() => createQueryClient(handleUnauthorized));

  // a font that fails to load falls back to the system face rather than blocking the app
  if (!fontsLoaded && !fontError) return null;

  return (
    <SafeAreaProvider>
      <QueryClientProvider client={queryClient}>
        <SessionProvider>
          <StatusBar style="dark" />
          <UntilSessionKnown>
            <Slot />
          </UntilSessionKnown>
        </SessionProvider>
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}

/**
 * The route groups' navigators mount only once we know whether someone is signed in:
 * a group layout that first renders a placeholder instead of its <Slot /> makes Expo
 * Router fall back to the group's index route, which would lose a deep link.
 */
function UntilSessionKnown({ children }: { children: ReactNode }) {
  const { status } = useSession();
  if (status === 'loading') return <CenteredMessage busy testID="session-loading" />;
  return <>{children}</>;
}

export { ErrorScreen as ErrorBoundary } from '../components/ErrorScreen';
