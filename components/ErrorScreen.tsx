import type { ErrorBoundaryProps } from 'expo-router';
import { Button } from './ui/Button';
import { CenteredMessage } from './ui/CenteredMessage';

/**
 * What a route shows when it throws while rendering (exported as `ErrorBoundary` by the
 * layouts). It needs no provider, so it also works above the root providers.
 */
export function ErrorScreen({ error, retry }: ErrorBoundaryProps) {
  return (
    <CenteredMessage
      testID="render-error"
      title="This page stopped working"
      text={`Samplewright hit an error it did not expect: ${error.message}. What was saved is safe on the server.`}
    >
      <Button label="Try again" onPress={() => void retry()} />
    </CenteredMessage>
  );
}
