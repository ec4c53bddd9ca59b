import { useMemo, useState } from 'react';
import { Pressable, ScrollView, View } from 'react-native';
import type { BundleFile } from '../../schemas/implementation-api';
import { useTheme } from '../theme';
import { Text } from '../ui/Text';
import { clipLines, fileTabLabel } from './display';

/** Lines shown of one file; the rest is in the bundle (test vectors run to thousands of lines). */
export const CODE_VIEW_MAX_LINES = 400;

/** Web: keep each line on one line (the view scrolls sideways instead). */
const NO_WRAP = { whiteSpace: 'pre' } as object;

/** Files first that a reader opens first: header, source, then the rest in bundle order. */
function tabOrder(files: BundleFile[]): BundleFile[] {
  const rank = (p: string) => (p.endsWith('.h') ? 0 : p.startsWith('src/') && p.endsWith('.c') ? 1 : 2);
  return [...files].sort((a, b) => rank(a.path) - rank(b.path));
}

interface Props {
  files: BundleFile[];
  /** where the files come from, one line above the tabs */
  source: string;
  stale?: boolean;
}

/** The generated files: one tab per file, the text in the shipped monospace font, scrolling sideways. */
export function CodeView({ files, source, stale }: Props) {
  const { colors, radius, space, font } = useTheme();
  const ordered = useMemo(() => tabOrder(files), [files]);
  const [chosen, setChosen] = useState<string | null>(null);
  const current = ordered.find((f) => f.path === chosen) ?? ordered[0];
  const view = useMemo(() => (current ? clipLines(current.content, CODE_VIEW_MAX_LINES) : null), [current]);
  const gutter = view ? String(view.lines.length).length * 8 + 14 : 0;

  return (
    <View testID="impl-code" style={{ gap: space.sm, opacity: stale ? 0.6 : 1 }}>
      <Text variant="small">{source}</Text>
      <ScrollView horizontal showsHorizontalScrollIndicator={false} contentContainerStyle={{ gap: space.xs }}>
        {ordered.map((f) => {
          const selected = f === current;
          return (
            <Pressable
              key={f.path}
              testID={`impl-code-tab-${f.path}`}
              accessibilityRole="tab"
              accessibilityState={{ selected }}
              aria-selected={selected}
              accessibilityLabel={f.path}
              onPress={() => setChosen(f.path)}
              style={{
                paddingHorizontal: space.md,
                paddingVertical: 6,
                borderRadius: radius.sm,
                borderWidth: 1,
                borderColor: selected ? colors.primary : colors.border,
                backgroundColor: selected ? colors.primary : colors.surface,
              }}
            >
              <Text variant="label" style={{ color: selected ? colors.primaryText : colors.text, fontFamily: font.mono, fontSize: 12.5 }}>
                {fileTabLabel(f.path)}
              </Text>
            </Pressable>
          );
        })}
      </ScrollView>
      {current && view ? (
        <View style={{ borderWidth: 1, borderColor: '#2b3238', borderRadius: radius.md, backgroundColor: '#1b2024', overflow: 'hidden' }}>
          <View style={{ flexDirection: 'row', justifyContent: 'space-between', paddingHorizontal: space.md, paddingVertical: 6, backgroundColor: '#242a2f', gap: space.md }}>
            <Text testID="impl-code-path" style={{ fontFamily: font.mono, fontSize: 12, color: '#c9d1d6' }} numberOfLines={1}>
              {current.path}
            </Text>
            <Text style={{ fontFamily: font.mono, fontSize: 12, color: '#8b969d' }}>
              {view.total} line{view.total === 1 ? '' : 's'}
            </Text>
          </View>
          <ScrollView style={{ maxHeight: 520 }} nestedScrollEnabled>
            <ScrollView horizontal showsHorizontalScrollIndicator testID="impl-code-scroll">
              <View style={{ flexDirection: 'row', paddingVertical: space.sm }}>
                <Text selectable={false} style={{ fontFamily: font.mono, fontSize: 12.5, lineHeight: 19, color: '#5d6870', textAlign: 'right', width: gutter, paddingRight: 10 }}>
                  {view.lines.map((_, i) => i + 1).join('\n')}
                </Text>
                <Text testID="impl-code-text" selectable style={{ fontFamily: font.mono, fontSize: 12.5, lineHeight: 19, color: '#e4e8eb', paddingRight: space.lg, ...NO_WRAP }}>
                  {view.lines.join('\n')}
                </Text>
              </View>
            </ScrollView>
          </ScrollView>
          {view.clipped ? (
            <Text style={{ fontFamily: font.regular, fontSize: 12, color: '#8b969d', paddingHorizontal: space.md, paddingVertical: 6, backgroundColor: '#242a2f' }}>
              The first {CODE_VIEW_MAX_LINES} of {view.total} lines; the whole file is in the bundle.
            </Text>
          ) : null}
        </View>
      ) : (
        <Text variant="small">No files.</Text>
      )}
    </View>
  );
}
