import type { ReactNode } from 'react';
import { ScrollView, View, useWindowDimensions } from 'react-native';
import { Link } from 'expo-router';
import Head from 'expo-router/head';
import { useTheme } from '../theme';
import { Text } from './Text';

export interface ScreenProps {
  title: string;
  /** one line under the title */
  subtitle?: string;
  /** buttons at the right of the title (below it on a phone) */
  actions?: ReactNode;
  children: ReactNode;
  /** content width limit in px; wide tables and plots may ask for more */
  maxWidth?: number;
  testID?: string;
}

/**
 * The body of every signed-in screen: a scrolling column with the page title, the
 * content, and the shell's one-line caution with a link to the full text.
 */
export function Screen({ title, subtitle, actions, children, maxWidth = 960, testID }: ScreenProps) {
  const { colors, space, wideBreakpoint } = useTheme();
  const { width } = useWindowDimensions();
  const wide = width >= wideBreakpoint;
  const pad = wide ? space.xxl : space.lg;
  return (
    <ScrollView
      testID={testID}
      style={{ flex: 1, backgroundColor: colors.background }}
      contentContainerStyle={{ paddingHorizontal: pad, paddingTop: wide ? space.xxl : space.xl, paddingBottom: space.xxl, flexGrow: 1 }}
    >
      <Head>
        <title>{`${title} · Samplewright`}</title>
      </Head>
      <View style={{ width: '100%', maxWidth, alignSelf: 'center', flexGrow: 1, gap: space.xl }}>
        <View
          style={{
            flexDirection: wide ? 'row' : 'column',
            alignItems: wide ? 'flex-end' : 'stretch',
            justifyContent: 'space-between',
            gap: space.md,
          }}
        >
          <View style={{ gap: space.xs, flexShrink: 1 }}>
            <Text variant="heading" accessibilityRole="header">
              {title}
            </Text>
            {subtitle ? <Text tone="textMuted">{subtitle}</Text> : null}
          </View>
          {actions ? <View style={{ flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' }}>{actions}</View> : null}
        </View>
        <View style={{ gap: space.lg, flexGrow: 1 }}>{children}</View>
        <CautionLine />
      </View>
    </ScrollView>
  );
}

/** DESIGN.md "Cautions the product shows", in one line, linking to the full text. */
export function CautionLine() {
  const { colors, space } = useTheme();
  return (
    <View
      testID="caution-line"
      style={{ borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.md, marginTop: space.md }}
    >
      <Text variant="small">
        Generated controllers drive real actuators: verify on the target with current and travel limits in place.
        Not certified for safety-related use.{' '}
        <Link href="/about" style={{ color: colors.primary, textDecorationLine: 'underline' }}>
          Account and cautions
        </Link>
      </Text>
    </View>
  );
}
