import type { ReactNode } from 'react';
import { ScrollView, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from '../ui/Text';

export interface FigureColumn {
  key: string;
  title: string;
  width: number;
  /** numbers are right-aligned in the monospace font */
  numeric?: boolean;
}

export interface FigureRow {
  key: string;
  cells: Record<string, ReactNode>;
  /** a tint for the whole row */
  tone?: 'plain' | 'good' | 'bad' | 'group';
  testID?: string;
}

/** A table of figures that scrolls sideways when it is wider than the screen. */
export function FigureTable({ columns, rows, testID }: { columns: FigureColumn[]; rows: FigureRow[]; testID?: string }) {
  const { colors, radius, space, font } = useTheme();
  const cell = { paddingHorizontal: space.sm, paddingVertical: 6, justifyContent: 'center' as const };
  const tint = { plain: undefined, good: '#e9f3eb', bad: '#fcefee', group: colors.surfaceAlt } as const;
  return (
    <ScrollView
      horizontal
      testID={testID}
      showsHorizontalScrollIndicator
      style={{ borderWidth: 1, borderColor: colors.border, borderRadius: radius.md, backgroundColor: colors.surface }}
    >
      <View>
        <View style={{ flexDirection: 'row', backgroundColor: colors.surfaceAlt, borderBottomWidth: 1, borderBottomColor: colors.border }}>
          {columns.map((c) => (
            <View key={c.key} style={[cell, { width: c.width, alignItems: c.numeric ? 'flex-end' : 'flex-start' }]}>
              <Text variant="overline" numberOfLines={1}>
                {c.title}
              </Text>
            </View>
          ))}
        </View>
        {rows.map((r, i) => (
          <View
            key={r.key}
            testID={r.testID}
            style={{
              flexDirection: 'row',
              borderBottomWidth: i === rows.length - 1 ? 0 : 1,
              borderBottomColor: colors.surfaceAlt,
              backgroundColor: tint[r.tone ?? 'plain'],
            }}
          >
            {columns.map((c) => {
              const v = r.cells[c.key];
              return (
                <View key={c.key} style={[cell, { width: c.width, alignItems: c.numeric ? 'flex-end' : 'flex-start' }]}>
                  {typeof v === 'string' || typeof v === 'number' ? (
                    <Text
                      variant="small"
                      numberOfLines={1}
                      style={{ color: colors.text, ...(c.numeric ? { fontFamily: font.mono, fontSize: 12.5 } : null) }}
                    >
                      {v}
                    </Text>
                  ) : (
                    v ?? null
                  )}
                </View>
              );
            })}
          </View>
        ))}
      </View>
    </ScrollView>
  );
}
