import { Link } from 'expo-router';
import { View } from 'react-native';
import type { VersionStatus, VersionSummary } from '../../schemas/design';
import { useTheme } from '../theme';
import { Card } from '../ui/Card';
import { Text } from '../ui/Text';

const STATUS_LABELS: Record<VersionStatus, string> = {
  draft: 'draft',
  'in-review': 'in review',
  approved: 'approved',
  'changes-requested': 'changes requested',
};

export function statusLabel(status: VersionStatus): string {
  return STATUS_LABELS[status];
}

/** Short date and time in the viewer's locale. */
export function formatWhen(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { year: 'numeric', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/** Every saved version, newest first; each opens read-only. */
export function VersionList({ designId, versions, current }: { designId: number; versions: VersionSummary[]; current: number }) {
  const { colors, space, radius } = useTheme();
  const sorted = [...versions].sort((a, b) => b.number - a.number);
  const newest = sorted[0]?.number;
  return (
    <Card testID="version-list">
      <Text variant="title">Versions</Text>
      {sorted.map((v) => {
        const here = v.number === current;
        const params = v.number === newest ? { designId: String(designId) } : { designId: String(designId), version: String(v.number) };
        return (
          <Link key={v.number} href={{ pathname: '/designs/[designId]', params }} testID={`design-version-${v.number}`}>
            <View style={{ flexDirection: 'row', justifyContent: 'space-between', gap: space.md, paddingVertical: space.sm, paddingHorizontal: space.sm, borderRadius: radius.sm, backgroundColor: here ? colors.surfaceAlt : undefined, width: '100%' }}>
              <View style={{ gap: 2, flexShrink: 1 }}>
                <Text variant="bodyMedium" tone={here ? undefined : 'primary'}>
                  Version {v.number}
                  {v.number === newest ? ' (latest)' : ''}
                </Text>
                <Text variant="small">
                  {v.authorName} · {formatWhen(v.createdAt)}
                </Text>
              </View>
              <Text variant="small" style={{ alignSelf: 'center' }}>
                {statusLabel(v.status)}
              </Text>
            </View>
          </Link>
        );
      })}
    </Card>
  );
}
