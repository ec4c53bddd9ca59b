import { useState } from 'react';
import { Modal, Pressable, View } from 'react-native';
import { useCurrentWorkspace, useSession } from '../data/session';
import { ROLE_LABELS } from '../roles';
import { isHovered } from '../ui/pressable';
import { useTheme } from '../theme';
import { CheckIcon, ChevronDownIcon } from '../ui/icons';
import { Text } from '../ui/Text';

export interface WorkspaceSwitcherProps {
  /** full-width block in the side column, or a compact line in the phone header */
  variant: 'block' | 'inline';
}

/** Shows the current workspace; pressing it lists every workspace the user belongs to. */
export function WorkspaceSwitcher({ variant }: WorkspaceSwitcherProps) {
  const { colors, radius, space } = useTheme();
  const { memberships } = useSession();
  const { workspace, setWorkspaceId } = useCurrentWorkspace();
  const [open, setOpen] = useState(false);

  return (
    <>
      <Pressable
        testID="workspace-switcher"
        accessibilityRole="button"
        accessibilityLabel={`Workspace: ${workspace.name}. Switch workspace`}
        onPress={() => setOpen(true)}
        style={(state) => {
          const hovered = isHovered(state);
          return [
          {
            flexDirection: 'row',
            alignItems: 'center',
            gap: space.xs,
            borderRadius: radius.md,
            flexShrink: 1,
          },
          variant === 'block'
            ? {
                borderWidth: 1,
                borderColor: colors.border,
                paddingHorizontal: space.md,
                paddingVertical: space.sm,
                backgroundColor: hovered ? colors.surfaceAlt : colors.background,
              }
            : { paddingVertical: 2 },
        ];
        }}
      >
        <View style={{ flexShrink: 1, flexGrow: variant === 'block' ? 1 : 0 }}>
          {variant === 'block' ? <Text variant="overline">Workspace</Text> : null}
          <Text variant={variant === 'block' ? 'bodyMedium' : 'label'} numberOfLines={1}>
            {workspace.name}
          </Text>
        </View>
        <ChevronDownIcon color={colors.textMuted} size={variant === 'block' ? 18 : 14} />
      </Pressable>

      <Modal visible={open} transparent animationType="fade" onRequestClose={() => setOpen(false)}>
        <Pressable
          accessibilityLabel="Close the workspace list"
          onPress={() => setOpen(false)}
          style={{ flex: 1, backgroundColor: 'rgba(29,35,39,0.35)', justifyContent: 'center', padding: space.lg }}
        >
          <Pressable
            onPress={(e) => e.stopPropagation()}
            style={{
              alignSelf: 'center',
              width: '100%',
              maxWidth: 420,
              backgroundColor: colors.surface,
              borderRadius: radius.lg,
              padding: space.lg,
              gap: space.sm,
            }}
          >
            <Text variant="title">Switch workspace</Text>
            <Text variant="small">Designs, members and reviews are kept per workspace.</Text>
            <View style={{ gap: space.xs, marginTop: space.sm }} accessibilityRole="list">
              {memberships.map((m) => {
                const selected = m.workspace.id === workspace.id;
                return (
                  <Pressable
                    key={m.workspace.id}
                    testID={`workspace-option-${m.workspace.slug}`}
                    accessibilityRole="button"
                    accessibilityState={{ selected }}
                    onPress={() => {
                      setWorkspaceId(m.workspace.id);
                      setOpen(false);
                    }}
                    style={(state) => {
                    const hovered = isHovered(state);
                    return ({
                      flexDirection: 'row',
                      alignItems: 'center',
                      gap: space.md,
                      padding: space.md,
                      borderRadius: radius.md,
                      borderWidth: 1,
                      borderColor: selected ? colors.primary : colors.border,
                      backgroundColor: hovered ? colors.surfaceAlt : colors.surface,
                    });
                  }}
                  >
                    <View style={{ flex: 1 }}>
                      <Text variant="bodyMedium">{m.workspace.name}</Text>
                      <Text variant="small">{ROLE_LABELS[m.role]}</Text>
                    </View>
                    {selected ? <CheckIcon color={colors.primary} /> : null}
                  </Pressable>
                );
              })}
            </View>
          </Pressable>
        </Pressable>
      </Modal>
    </>
  );
}
