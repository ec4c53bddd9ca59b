import { ActivityIndicator, View, useWindowDimensions } from 'react-native';
import { useMembers } from '../data/members';
import { useCurrentWorkspace, useSession } from '../data/session';
import { ROLE_LABELS } from '../roles';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Screen } from '../ui/Screen';
import { Text } from '../ui/Text';
import { AddMemberCard } from './AddMemberCard';
import { MemberRow } from './MemberRow';

export function MembersScreen() {
  const { colors, radius, space, wideBreakpoint } = useTheme();
  const { width } = useWindowDimensions();
  const wide = width >= 720;
  const { workspace, role } = useCurrentWorkspace();
  const { user } = useSession();
  const members = useMembers(workspace.id);
  const isOwner = role === 'owner';
  const count = members.data?.length;

  return (
    <Screen
      testID="members-screen"
      title="Members"
      subtitle={count === undefined ? workspace.name : `${workspace.name} · ${count} ${count === 1 ? 'person' : 'people'}`}
      maxWidth={width >= wideBreakpoint ? 960 : undefined}
    >
      {isOwner ? (
        <AddMemberCard workspaceId={workspace.id} />
      ) : (
        <Card tone="muted" testID="members-read-only">
          <Text variant="small" style={{ color: colors.text }}>
            You are {/^[aeiou]/i.test(role) ? 'an' : 'a'} {ROLE_LABELS[role].toLowerCase()} here. Only owners add
            members, change roles or remove people.
          </Text>
        </Card>
      )}

      <View
        testID="member-list"
        style={{ backgroundColor: colors.surface, borderWidth: 1, borderColor: colors.border, borderRadius: radius.lg, overflow: 'hidden' }}
      >
        {members.isPending ? (
          <View style={{ padding: space.xl, alignItems: 'center' }}>
            <ActivityIndicator color={colors.primary} />
          </View>
        ) : members.isError ? (
          <View style={{ padding: space.lg, gap: space.md }}>
            <Text tone="danger">{members.error.message}</Text>
            <Button label="Try again" kind="secondary" compact onPress={() => void members.refetch()} style={{ alignSelf: 'flex-start' }} />
          </View>
        ) : (
          members.data.map((member, index) => (
            <MemberRow
              key={member.userId}
              member={member}
              workspaceId={workspace.id}
              editable={isOwner}
              isSelf={member.userId === user?.id}
              wide={wide}
              last={index === members.data.length - 1}
            />
          ))
        )}
      </View>
    </Screen>
  );
}
