import type { ReactNode } from 'react';
import { ActivityIndicator, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './Text';

/** A full-screen waiting or problem state (session loading, no workspace, server down). */
export function CenteredMessage({ title, text, busy, children, testID }: { title?: string; text?: string; busy?: boolean; children?: ReactNode; testID?: string }) {
  const { colors, space } = useTheme();
  return (
    <View testID={testID} style={{ flex: 1, alignItems: 'center', justifyContent: 'center', padding: space.xl, gap: space.md, backgroundColor: colors.background }}>
      {busy ? <ActivityIndicator color={colors.primary} size="large" /> : null}
      {title ? <Text variant="title" style={{ textAlign: 'center' }}>{title}</Text> : null}
      {text ? <Text tone="textMuted" style={{ textAlign: 'center', maxWidth: 420 }}>{text}</Text> : null}
      {children}
    </View>
  );
}
