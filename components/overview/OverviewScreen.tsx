import { View } from 'react-native';
import { Link } from 'expo-router';
import { useCurrentWorkspace, useSession } from '../data/session';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../roles';
import { useTheme } from '../theme';
import { Card } from '../ui/Card';
import { DesignsIcon, MembersIcon, type IconProps } from '../ui/icons';
import { LinkPressable } from '../ui/pressable';
import { Screen } from '../ui/Screen';
import { Text } from '../ui/Text';
import type { ComponentType } from 'react';

/** The path of a design through Samplewright, in our own words. */
const STEPS = [
  { title: 'Enter the analog design', text: 'Gain, zeros and poles, polynomials, or the resistors and capacitors of an op-amp lead network.' },
  { title: 'Choose a sample rate and compare', text: 'Tustin, prewarped Tustin, matched pole–zero, zero-order hold and backward Euler side by side: pole–zero map, Bode plot, margins.' },
  { title: 'Fix the arithmetic', text: 'Word length, input and output scaling, saturation limits; the quantized coefficients are checked again.' },
  { title: 'Review, then download', text: 'A reviewer approves a version; its C source, test vectors and manifest become an immutable bundle.' },
] as const;

function firstName(name: string | undefined): string {
  return (name ?? '').trim().split(/\s+/)[0] ?? '';
}

function QuickLink({ href, title, text, Icon, testID }: { href: '/designs' | '/members'; title: string; text: string; Icon: ComponentType<IconProps>; testID: string }) {
  const { colors, radius, space } = useTheme();
  return (
    <Link href={href} asChild>
      <LinkPressable
        testID={testID}
        accessibilityRole="link"
        styleFor={({ hovered }) => ({
          flexGrow: 1,
          flexBasis: 260,
          flexDirection: 'row',
          gap: space.md,
          padding: space.lg,
          borderRadius: radius.lg,
          borderWidth: 1,
          borderColor: hovered ? colors.primary : colors.border,
          backgroundColor: colors.surface,
        })}
      >
        <View style={{ width: 40, height: 40, borderRadius: radius.md, backgroundColor: '#e3edf4', alignItems: 'center', justifyContent: 'center' }}>
          <Icon color={colors.primary} size={22} />
        </View>
        <View style={{ flex: 1, gap: 2 }}>
          <Text variant="bodyMedium">{title}</Text>
          <Text variant="small">{text}</Text>
        </View>
      </LinkPressable>
    </Link>
  );
}

export function OverviewScreen() {
  const { colors, space, radius } = useTheme();
  const { user } = useSession();
  const { workspace, role } = useCurrentWorkspace();
  const name = firstName(user?.name);

  return (
    <Screen testID="overview-screen" title={name ? `Welcome, ${name}` : 'Welcome'} subtitle={workspace.name}>
      <Card style={{ flexDirection: 'row', gap: space.lg, alignItems: 'center', flexWrap: 'wrap' }}>
        <View style={{ flex: 1, minWidth: 220, gap: space.xs }}>
          <Text variant="overline">Your role here</Text>
          <Text variant="title">{ROLE_LABELS[role]}</Text>
          <Text variant="small">{ROLE_SUMMARIES[role]}</Text>
        </View>
        <View style={{ gap: 2 }}>
          <Text variant="overline">Workspace</Text>
          <Text variant="mono" style={{ fontSize: 13, color: colors.textMuted }}>
            {workspace.slug}
          </Text>
        </View>
      </Card>

      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.md }}>
        <QuickLink
          testID="overview-designs"
          href="/designs"
          title="Designs"
          text="Compensators of this workspace, their versions and review state."
          Icon={DesignsIcon}
        />
        <QuickLink
          testID="overview-members"
          href="/members"
          title="Members"
          text={role === 'owner' ? 'Add people, change roles.' : 'Who works in this workspace, and in which role.'}
          Icon={MembersIcon}
        />
      </View>

      <View style={{ gap: space.md }}>
        <Text variant="title">From s to C in four steps</Text>
        <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.md }}>
          {STEPS.map((step, index) => (
            <View
              key={step.title}
              style={{
                flexGrow: 1,
                flexBasis: 200,
                padding: space.lg,
                gap: space.sm,
                borderRadius: radius.lg,
                backgroundColor: colors.surfaceAlt,
              }}
            >
              <Text variant="mono" style={{ color: colors.primary, fontSize: 13 }}>
                {String(index + 1).padStart(2, '0')}
              </Text>
              <Text variant="bodyMedium">{step.title}</Text>
              <Text variant="small">{step.text}</Text>
            </View>
          ))}
        </View>
      </View>
    </Screen>
  );
}
