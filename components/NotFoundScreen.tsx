import { View } from 'react-native';
import { Link, usePathname } from 'expo-router';
import { useTheme } from './theme';
import { Text } from './ui/Text';

export function NotFoundScreen() {
  const { colors, space, font } = useTheme();
  const pathname = usePathname();
  return (
    <View testID="not-found" style={{ flex: 1, alignItems: 'center', justifyContent: 'center', padding: space.xl, gap: space.md, backgroundColor: colors.background }}>
      <Text variant="mono" tone="textMuted">
        404
      </Text>
      <Text variant="heading">Nothing at this address</Text>
      <Text tone="textMuted" style={{ textAlign: 'center' }}>
        <Text variant="mono">{pathname}</Text> is not a page of Samplewright.
      </Text>
      <Link href="/" style={{ color: colors.primary, fontFamily: font.medium, fontSize: 15 }}>
        Go to the overview
      </Link>
    </View>
  );
}
