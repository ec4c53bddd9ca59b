import { useRouter } from 'expo-router';
import { useState } from 'react';
import { ActivityIndicator, Pressable, View } from 'react-native';
import type { DesignSummary } from '../../schemas/design';
import { useCurrentWorkspace } from '../data/session';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { isHovered } from '../ui/pressable';
import { Screen } from '../ui/Screen';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';
import { useLayoutWidth } from '../plots/useLayoutWidth';
import { useDesigns, useUpdateDesign } from './queries';
import { formatWhen, statusLabel } from './VersionList';

/** The workspace's designs: open, create, rename, archive and unarchive; archived ones on request. */
export function DesignListScreen() {
  const { colors, radius, space } = useTheme();
  const router = useRouter();
  const { workspace, role } = useCurrentWorkspace();
  const writable = role === 'owner' || role === 'engineer';
  const [archived, setArchived] = useState(false);
  const designs = useDesigns(workspace.id, archived);
  const { width, onLayout } = useLayoutWidth();

  return (
    <Screen
      testID="designs-screen"
      title="Designs"
      subtitle={`${workspace.name} · compensators and their discrete versions`}
      actions={writable ? <Button testID="design-new" label="New design" onPress={() => router.push('/designs/new')} /> : undefined}
    >
      <Segmented
        testID="designs-filter"
        accessibilityLabel="Which designs to list"
        options={[
          { value: 'active', label: 'Active' },
          { value: 'archived', label: 'Archived' },
        ]}
        value={archived ? 'archived' : 'active'}
        onChange={(v) => setArchived(v === 'archived')}
        compact
      />
      <View onLayout={onLayout} testID="design-list" style={{ backgroundColor: colors.surface, borderWidth: 1, borderColor: colors.border, borderRadius: radius.lg, overflow: 'hidden' }}>
        {designs.isPending ? (
          <View style={{ padding: space.xl, alignItems: 'center' }}>
            <ActivityIndicator color={colors.primary} />
          </View>
        ) : designs.isError ? (
          <View style={{ padding: space.lg, gap: space.md }}>
            <Text tone="danger">{designs.error.message}</Text>
            <Button label="Try again" kind="secondary" compact onPress={() => void designs.refetch()} style={{ alignSelf: 'flex-start' }} />
          </View>
        ) : designs.data.length === 0 ? (
          <View style={{ padding: space.xl, gap: space.sm }} testID="designs-empty">
            <Text variant="bodyMedium">{archived ? 'No archived designs.' : 'No designs yet.'}</Text>
            {!archived && writable ? <Text variant="small">Start one with “New design”: enter a lead or lag, pick a sample rate and compare the five methods.</Text> : null}
          </View>
        ) : (
          designs.data.map((d, i) => (
            <DesignRow key={d.id} design={d} writable={writable} wide={width >= 640} last={i === designs.data.length - 1} onOpen={() => router.push({ pathname: '/designs/[designId]', params: { designId: String(d.id) } })} />
          ))
        )}
      </View>
    </Screen>
  );
}

function DesignRow({ design, writable, wide, last, onOpen }: { design: DesignSummary; writable: boolean; wide: boolean; last: boolean; onOpen(): void }) {
  const { colors, space } = useTheme();
  const { workspace } = useCurrentWorkspace();
  const update = useUpdateDesign(workspace.id);
  const [renaming, setRenaming] = useState(false);
  const [name, setName] = useState(design.name);
  const v = design.latestVersion;
  return (
    <View testID={`design-row-${design.id}`} style={{ borderBottomWidth: last ? 0 : 1, borderBottomColor: colors.surfaceAlt }}>
      <Pressable
        onPress={renaming ? undefined : onOpen}
        accessibilityRole="link"
        accessibilityLabel={`Open ${design.name}`}
        testID={`design-open-${design.id}`}
        style={(state) => ({ padding: 16, backgroundColor: isHovered(state) && !renaming ? colors.surfaceAlt : undefined, flexDirection: wide ? 'row' : 'column', gap: space.sm, justifyContent: 'space-between', alignItems: wide ? 'center' : 'stretch' })}
      >
        <View style={{ gap: 2, flexShrink: 1 }}>
          <Text variant="bodyMedium">{design.name}</Text>
          <Text variant="small">
            Version {v.number} · {statusLabel(v.status)} · {v.authorName} · {formatWhen(design.updatedAt)}
          </Text>
        </View>
        {writable && !renaming ? (
          <View style={{ flexDirection: 'row', gap: space.sm }}>
            <Button testID={`design-rename-${design.id}`} label="Rename" kind="secondary" compact onPress={() => setRenaming(true)} />
            <Button
              testID={`design-archive-${design.id}`}
              label={design.archived ? 'Unarchive' : 'Archive'}
              kind="secondary"
              compact
              busy={update.isPending && !renaming}
              onPress={() => update.mutate({ designId: design.id, archived: !design.archived })}
            />
          </View>
        ) : null}
      </Pressable>
      {renaming ? (
        <Card tone="muted" style={{ margin: space.md, marginTop: 0 }}>
          <TextField testID={`design-rename-input-${design.id}`} label="New name" value={name} onChangeText={setName} maxLength={120} error={update.error?.message} />
          <View style={{ flexDirection: 'row', gap: space.sm }}>
            <Button label="Save name" compact disabled={name.trim() === ''} busy={update.isPending} onPress={() => update.mutate({ designId: design.id, name: name.trim() }, { onSuccess: () => setRenaming(false) })} testID={`design-rename-save-${design.id}`} />
            <Button label="Cancel" kind="quiet" compact onPress={() => { setRenaming(false); setName(design.name); }} />
          </View>
        </Card>
      ) : null}
      {update.error && !renaming ? (
        <Text variant="small" tone="danger" style={{ paddingHorizontal: 16, paddingBottom: 8 }}>
          {update.error.message}
        </Text>
      ) : null}
    </View>
  );
}
