import { StyleSheet, Text, View } from 'react-native';
import { useTheme } from '../theme';

export interface LegendItem {
  key: string;
  label: string;
  color: string;
  dashed?: boolean;
}

/** A wrapping row of coloured swatches with labels, under a plot. */
export function Legend({ items }: { items: LegendItem[] }) {
  const t = useTheme();
  return (
    <View style={styles.row}>
      {items.map((it) => (
        <View key={it.key} style={styles.item}>
          <View
            style={[
              styles.swatch,
              { borderColor: it.color, borderStyle: it.dashed ? 'dashed' : 'solid' },
            ]}
          />
          <Text style={{ color: t.colors.textMuted, fontSize: t.size.small, fontFamily: t.font.regular }}>{it.label}</Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: 12, marginTop: 6 },
  item: { flexDirection: 'row', alignItems: 'center', gap: 6 },
  swatch: { width: 18, height: 0, borderTopWidth: 3 },
});
