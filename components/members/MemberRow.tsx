import { useState } from 'react';
import { View } from 'react-native';
import type { Role } from '../../schemas/auth';
import type { Member } from '../../schemas/workspace';
import { useChangeRole, useRemoveMember } from '../data/members';
import { ROLE_LABELS, ROLE_OPTIONS } from '../roles';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';

export interface MemberRowProps {
  member: Member;
  workspaceId: number;
  /** owners may change roles and remove members */
  editable: boolean;
  isSelf: boolean;
  wide: boolean;
  last: boolean;
}

type Pending = { kind: 'remove' } | { kind: 'role'; role: Role } | null;

export function MemberRow({ member, workspaceId, editable, isSelf, wide, last }: MemberRowProps) {
  const { colors, radius, space } = useTheme();
  const changeRole = useChangeRole(workspaceId);
  const remove = useRemoveMember(workspaceId);
  // a removal, or an owner giving up their own ownership, waits for a second press
  const [confirm, setConfirm] = useState<Pending>(null);
  const error = changeRole.error ?? remove.error;
  const key = member.email;
  // a read-only row always fits on one line; the role controls need a wide row
  const inline = wide || !editable;

  const applyRole = (role: Role) => {
    if (role === member.role) return;
    remove.reset();
    if (isSelf && member.role === 'owner') {
      setConfirm({ kind: 'role', role });
      return;
    }
    changeRole.mutate({ userId: member.userId, role });
  };

  return (
    <View
      testID={`member-row-${key}`}
      style={{
        paddingVertical: space.md,
        paddingHorizontal: space.lg,
        borderBottomWidth: last ? 0 : 1,
        borderBottomColor: colors.border,
        gap: space.sm,
      }}
    >
      <View style={{ flexDirection: inline ? 'row' : 'column', alignItems: inline ? 'center' : 'stretch', gap: space.md }}>
        <View style={{ flex: inline ? 1 : undefined, minWidth: 0, gap: 2 }}>
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: space.sm }}>
            <Text variant="bodyMedium" numberOfLines={1} style={{ flexShrink: 1 }}>
              {member.name || member.email}
            </Text>
            {isSelf ? (
              <View style={{ backgroundColor: colors.surfaceAlt, borderRadius: radius.sm, paddingHorizontal: 6 }}>
                <Text variant="small">you</Text>
              </View>
            ) : null}
          </View>
          <Text variant="small" numberOfLines={1}>
            {member.email}
          </Text>
        </View>
        {editable ? (
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' }}>
            <Segmented
              testID={`member-role-${key}`}
              accessibilityLabel={`Role of ${member.email}`}
              options={ROLE_OPTIONS}
              value={member.role}
              onChange={applyRole}
              disabled={changeRole.isPending}
              compact
            />
            <Button
              testID={`member-remove-${key}`}
              label="Remove"
              kind="quiet"
              compact
              onPress={() => {
                changeRole.reset();
                setConfirm({ kind: 'remove' });
              }}
            />
          </View>
        ) : (
          <Text testID={`member-role-${key}`} variant="label" tone="textMuted">
            {ROLE_LABELS[member.role]}
          </Text>
        )}
      </View>

      {confirm ? (
        <View
          style={{
            flexDirection: wide ? 'row' : 'column',
            alignItems: wide ? 'center' : 'stretch',
            gap: space.sm,
            backgroundColor: '#fcefee',
            borderRadius: radius.md,
            padding: space.md,
          }}
        >
          <Text style={{ flex: wide ? 1 : undefined }}>
            {confirm.kind === 'remove'
              ? isSelf
                ? 'Remove yourself from this workspace? You will lose access to it.'
                : `Remove ${member.name || member.email} from this workspace?`
              : `Change your own role to ${ROLE_LABELS[confirm.role]}? You will no longer manage members.`}
          </Text>
          <View style={{ flexDirection: 'row', gap: space.sm }}>
            <Button label="Cancel" kind="secondary" compact onPress={() => setConfirm(null)} />
            <Button
              testID={`member-confirm-${key}`}
              label={confirm.kind === 'remove' ? 'Remove' : 'Change role'}
              kind="danger"
              compact
              busy={remove.isPending || changeRole.isPending}
              onPress={() => {
                const pending = confirm;
                setConfirm(null);
                if (pending.kind === 'remove') remove.mutate(member.userId);
                else changeRole.mutate({ userId: member.userId, role: pending.role });
              }}
            />
          </View>
        </View>
      ) : null}

      {error ? (
        <Text testID={`member-error-${key}`} variant="small" tone="danger" accessibilityRole="alert">
          {error.message}
        </Text>
      ) : null}
    </View>
  );
}
