import { useState, type ReactNode } from 'react';
import { Modal, Pressable, View, useWindowDimensions } from 'react-native';
import { Link, router, usePathname } from 'expo-router';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { useCurrentWorkspace, useSession, useSignOut } from '../data/session';
import { ROLE_LABELS } from '../roles';
import { LinkPressable } from '../ui/pressable';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { InfoIcon, MarkIcon } from '../ui/icons';
import { Text } from '../ui/Text';
import { NAV_ITEMS } from './nav';
import { WorkspaceSwitcher } from './WorkspaceSwitcher';

/**
 * The signed-in frame around every screen of app/(app)/: a compact header and a bottom
 * bar on phones, a side column from theme.wideBreakpoint up. Screens fill `children`
 * (usually with <Screen>), which gets all the remaining space.
 */
export function AppShell({ children }: { children: ReactNode }) {
  const { colors, wideBreakpoint } = useTheme();
  const { width } = useWindowDimensions();
  const wide = width >= wideBreakpoint;
  // `children` (the group's <Slot />) keeps its place in the tree at both widths: were it
  // remounted on a resize, Expo Router would fall back to the group's index route.
  return (
    <View style={{ flex: 1, flexDirection: wide ? 'row' : 'column', backgroundColor: colors.background }}>
      {wide ? <SideNav /> : <PhoneHeader />}
      <View style={{ flex: 1 }}>{children}</View>
      {wide ? null : <BottomBar />}
    </View>
  );
}

function RoleBadge({ testID, align = 'flex-start' }: { testID?: string; align?: 'flex-start' | 'center' }) {
  const { colors, radius, space } = useTheme();
  const { role } = useCurrentWorkspace();
  return (
    <View
      style={{
        alignSelf: align,
        backgroundColor: '#e3edf4',
        borderRadius: radius.sm,
        paddingHorizontal: space.sm,
        paddingVertical: 2,
      }}
    >
      <Text testID={testID} variant="label" style={{ color: colors.primary }} accessibilityLabel={`Your role: ${ROLE_LABELS[role]}`}>
        {ROLE_LABELS[role]}
      </Text>
    </View>
  );
}

function SignOutButton({ compact }: { compact?: boolean }) {
  const signOut = useSignOut();
  return (
    <View style={{ gap: 4 }}>
      <Button
        testID="sign-out"
        label="Sign out"
        kind="secondary"
        compact={compact}
        busy={signOut.isPending}
        onPress={() => signOut.mutate()}
      />
      {signOut.error ? (
        <Text variant="small" tone="danger">
          {signOut.error.message}
        </Text>
      ) : null}
    </View>
  );
}

function Brand({ size = 28 }: { size?: number }) {
  const { colors, space } = useTheme();
  return (
    <View style={{ flexDirection: 'row', alignItems: 'center', gap: space.sm }}>
      <MarkIcon size={size} color={colors.primary} accent="#f3c969" />
      <Text variant="bodyMedium" style={{ fontSize: 16, letterSpacing: -0.2 }}>
        Samplewright
      </Text>
    </View>
  );
}

/** The side column from theme.wideBreakpoint up: brand, workspace, navigation, account. */
function SideNav() {
  const { colors, radius, space } = useTheme();
  const pathname = usePathname();
  const { user } = useSession();
  return (
    <View
      testID="side-nav"
      role="navigation"
      style={{
        width: 252,
        backgroundColor: colors.surface,
        borderRightWidth: 1,
        borderRightColor: colors.border,
        padding: space.lg,
        gap: space.lg,
      }}
    >
      <View style={{ paddingHorizontal: space.xs, paddingTop: space.xs }}>
        <Brand />
      </View>
      <WorkspaceSwitcher variant="block" />
      <View style={{ gap: 2 }}>
        {NAV_ITEMS.map(({ href, label, Icon, testID, matches }) => {
          const active = matches(pathname);
          return (
            <Link key={href} href={href} asChild>
              <LinkPressable
                testID={testID}
                accessibilityRole="link"
                aria-current={active ? 'page' : undefined}
                styleFor={({ hovered }) => ({
                  flexDirection: 'row',
                  alignItems: 'center',
                  gap: space.md,
                  paddingHorizontal: space.md,
                  paddingVertical: space.sm + 2,
                  borderRadius: radius.md,
                  backgroundColor: active ? '#e3edf4' : hovered ? colors.surfaceAlt : 'transparent',
                })}
              >
                <Icon color={active ? colors.primary : colors.textMuted} size={20} />
                <Text variant="bodyMedium" style={{ color: active ? colors.primary : colors.text }}>
                  {label}
                </Text>
              </LinkPressable>
            </Link>
          );
        })}
      </View>
      <View style={{ flex: 1 }} />
      <Link href="/about" asChild>
        <Pressable
          testID="nav-about"
          accessibilityRole="link"
          style={{ flexDirection: 'row', alignItems: 'center', gap: space.sm, paddingHorizontal: space.md }}
        >
          <InfoIcon color={colors.textMuted} size={18} />
          <Text variant="small">Account and cautions</Text>
        </Pressable>
      </Link>
      <View style={{ borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.lg, gap: space.sm }}>
        <View style={{ gap: 2 }}>
          <Text variant="bodyMedium" numberOfLines={1}>
            {user?.name}
          </Text>
          <Text variant="small" numberOfLines={1}>
            {user?.email}
          </Text>
        </View>
        <RoleBadge testID="current-role" />
        <SignOutButton compact />
      </View>
    </View>
  );
}

function initialsOf(name: string | undefined): string {
  const parts = (name ?? '').trim().split(/\s+/).filter(Boolean);
  const letters = parts.length >= 2 ? parts[0]![0]! + parts[parts.length - 1]![0]! : (parts[0] ?? '?').slice(0, 2);
  return letters.toUpperCase();
}

/** The compact header of a phone: brand, workspace, role, and the account panel. */
function PhoneHeader() {
  const { colors, radius, space } = useTheme();
  const insets = useSafeAreaInsets();
  const { user } = useSession();
  const { workspace, role } = useCurrentWorkspace();
  const [accountOpen, setAccountOpen] = useState(false);

  return (
    <>
      <View
        testID="phone-header"
        style={{
          paddingTop: insets.top,
          backgroundColor: colors.surface,
          borderBottomWidth: 1,
          borderBottomColor: colors.border,
        }}
      >
        <View style={{ height: 56, flexDirection: 'row', alignItems: 'center', paddingHorizontal: space.lg, gap: space.md }}>
          <MarkIcon size={30} color={colors.primary} accent="#f3c969" />
          <View style={{ flex: 1, minWidth: 0 }}>
            <Text variant="overline" style={{ letterSpacing: 0.6 }}>
              Samplewright
            </Text>
            <WorkspaceSwitcher variant="inline" />
          </View>
          <RoleBadge testID="current-role" align="center" />
          <Pressable
            testID="account-menu"
            accessibilityRole="button"
            accessibilityLabel={`Account of ${user?.name ?? 'the signed-in user'}`}
            onPress={() => setAccountOpen(true)}
            style={{
              width: 36,
              height: 36,
              borderRadius: 18,
              backgroundColor: colors.surfaceAlt,
              borderWidth: 1,
              borderColor: colors.border,
              alignItems: 'center',
              justifyContent: 'center',
            }}
          >
            <Text variant="label">{initialsOf(user?.name)}</Text>
          </Pressable>
        </View>
      </View>

      <Modal visible={accountOpen} transparent animationType="fade" onRequestClose={() => setAccountOpen(false)}>
        <Pressable
          accessibilityLabel="Close the account panel"
          onPress={() => setAccountOpen(false)}
          style={{ flex: 1, backgroundColor: 'rgba(29,35,39,0.35)', justifyContent: 'flex-end' }}
        >
          <Pressable
            testID="account-panel"
            onPress={(e) => e.stopPropagation()}
            style={{
              backgroundColor: colors.surface,
              borderTopLeftRadius: radius.lg,
              borderTopRightRadius: radius.lg,
              padding: space.xl,
              paddingBottom: space.xl + insets.bottom,
              gap: space.lg,
            }}
          >
            <View style={{ gap: 2 }}>
              <Text variant="title">{user?.name}</Text>
              <Text variant="small">{user?.email}</Text>
            </View>
            <Text>
              {ROLE_LABELS[role]} in {workspace.name}
            </Text>
            <Pressable
              testID="account-about"
              accessibilityRole="link"
              onPress={() => {
                setAccountOpen(false);
                router.push('/about');
              }}
              style={{ flexDirection: 'row', alignItems: 'center', gap: space.sm }}
            >
              <InfoIcon color={colors.primary} size={18} />
              <Text variant="bodyMedium" tone="primary">
                Account and cautions
              </Text>
            </Pressable>
            <SignOutButton />
          </Pressable>
        </Pressable>
      </Modal>
    </>
  );
}

/** The phone's bottom navigation bar. */
function BottomBar() {
  const { colors } = useTheme();
  const insets = useSafeAreaInsets();
  const pathname = usePathname();
  return (
    <View
      testID="bottom-nav"
      role="navigation"
      style={{
        flexDirection: 'row',
        backgroundColor: colors.surface,
        borderTopWidth: 1,
        borderTopColor: colors.border,
        paddingBottom: insets.bottom,
      }}
    >
      {NAV_ITEMS.map(({ href, label, Icon, testID, matches }) => {
        const active = matches(pathname);
        return (
          <Link key={href} href={href} asChild>
            <Pressable
              testID={testID}
              accessibilityRole="link"
              aria-current={active ? 'page' : undefined}
              style={{ flex: 1, height: 60, alignItems: 'center', justifyContent: 'center', gap: 3 }}
            >
              <Icon color={active ? colors.primary : colors.textMuted} size={22} />
              <Text variant="label" style={{ fontSize: 12, color: active ? colors.primary : colors.textMuted }}>
                {label}
              </Text>
            </Pressable>
          </Link>
        );
      })}
    </View>
  );
}
