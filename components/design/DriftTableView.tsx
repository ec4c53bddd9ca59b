import { ScrollView, View } from 'react-native';
import { useLayoutWidth } from '../plots/useLayoutWidth';
import type { MethodName } from '../../schemas/discretize';
import { useTheme } from '../theme';
import { Text } from '../ui/Text';
import type { DriftTable } from './drift';
import { recommendedMethod } from './drift';
import { METHOD_LABELS, METHOD_SHORT } from './methods';

const LABEL_W = 150;
const REF_W = 86;
const MIN_COL_W = 84;
const MAX_COL_W = 140;
/** below this width each figure becomes a block of its own instead of a table row */
const STACK_BELOW = 600;

interface Props {
  table: DriftTable;
  chosen: MethodName;
  testID?: string;
}

/** All methods side by side, best value per row tinted, figures beyond tolerance in red. */
export function DriftTableView({ table, chosen, testID }: Props) {
  const { colors, radius, space, font } = useTheme();
  const rec = recommendedMethod(table);
  const rowsTotal = table.rows.length;
  const cellBase = { paddingHorizontal: space.sm, paddingVertical: 7, justifyContent: 'center' as const };
  const { width, onLayout } = useLayoutWidth();
  const stacked = width > 0 && width < STACK_BELOW;
  const COL_W = Math.max(MIN_COL_W, Math.min(MAX_COL_W, Math.floor((width - LABEL_W - REF_W - 2) / Math.max(1, table.methods.length))));
  return (
    <View testID={testID} style={{ gap: space.sm }} onLayout={onLayout}>
      {rec ? (
        <Text variant="small" style={{ color: colors.text }} testID="drift-recommendation">
          Closest to the continuous design: <Text variant="label">{METHOD_LABELS[rec]}</Text> —{' '}
          {table.withinTolerance[rec] ? 'within every tolerance' : 'outside a tolerance'}, best in {table.wins[rec] ?? 0} of {rowsTotal} rows.
          {rec !== chosen ? ` The chosen method is ${METHOD_LABELS[chosen]}.` : ''}
        </Text>
      ) : null}
      {stacked ? <StackedDrift table={table} chosen={chosen} /> : null}
      {!stacked && <ScrollView horizontal
        style={{ borderWidth: 1, borderColor: colors.border, borderRadius: radius.md, backgroundColor: colors.surface }} showsHorizontalScrollIndicator>
        <View>
          <View style={{ flexDirection: 'row', backgroundColor: colors.surfaceAlt, borderBottomWidth: 1, borderBottomColor: colors.border }}>
            <View style={[cellBase, { width: LABEL_W }]}>
              <Text variant="overline">Figure</Text>
            </View>
            <View style={[cellBase, { width: REF_W }]}>
              <Text variant="overline">H(s)</Text>
            </View>
            {table.methods.map((m) => (
              <View key={m} style={[cellBase, { width: COL_W, flexDirection: 'row', alignItems: 'center', gap: 6, justifyContent: 'flex-start' }]}>
                <View style={{ width: 9, height: 9, borderRadius: 5, backgroundColor: colors.series[m] }} />
                <Text variant="label" style={{ color: m === chosen ? colors.primary : colors.text }} numberOfLines={1}>
                  {METHOD_SHORT[m]}
                  {m === chosen ? ' ✓' : ''}
                </Text>
              </View>
            ))}
          </View>
          {table.rows.map((row, i) => (
            <View key={row.key} testID={`drift-row-${row.key}`} style={{ flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.surfaceAlt, backgroundColor: i % 2 ? '#fbfaf7' : colors.surface }}>
              <View style={[cellBase, { width: LABEL_W }]}>
                <Text variant="label">{row.label}</Text>
              </View>
              <View style={[cellBase, { width: REF_W }]}>
                <Text variant="small" style={{ fontFamily: font.mono, fontSize: 12 }}>{row.continuous ?? ''}</Text>
              </View>
              {table.methods.map((m) => {
                const cell = row.cells[m];
                const best = row.best.includes(m);
                return (
                  <View
                    key={m}
                    testID={best ? `drift-best-${row.key}-${m}` : undefined}
                    style={[cellBase, { width: COL_W, backgroundColor: best ? '#e3f0e5' : undefined, borderLeftWidth: best ? 3 : 0, borderLeftColor: colors.success }]}
                  >
                    <Text
                      style={{
                        fontFamily: best ? font.bold : font.mono,
                        fontSize: 12,
                        color: cell?.beyond ? colors.danger : best ? colors.success : colors.text,
                      }}
                    >
                      {cell?.text ?? '—'}
                    </Text>
                  </View>
                );
              })}
            </View>
          ))}
          <View style={{ flexDirection: 'row', backgroundColor: colors.surfaceAlt }}>
            <View style={[cellBase, { width: LABEL_W }]}>
              <Text variant="label">Within tolerances</Text>
            </View>
            <View style={[cellBase, { width: REF_W }]} />
            {table.methods.map((m) => (
              <View key={m} style={[cellBase, { width: COL_W }]}>
                <Text variant="label" tone={table.withinTolerance[m] ? 'success' : 'danger'}>
                  {table.withinTolerance[m] ? 'yes' : 'no'} · best ×{table.wins[m] ?? 0}
                </Text>
              </View>
            ))}
          </View>
        </View>
      </ScrollView>}
      <Text variant="small">
        Drift is measured on the equivalent s-plane roots s = ln z / T. Green marks the value closest to the continuous design in each row;
        red, a figure beyond the design's tolerance.
      </Text>
    </View>
  );
}

/** Narrow screens: one block per figure, the methods listed under it with the best one tinted. */
function StackedDrift({ table, chosen }: Props) {
  const { colors, radius, space, font } = useTheme();
  return (
    <View style={{ borderWidth: 1, borderColor: colors.border, borderRadius: radius.md, backgroundColor: colors.surface, overflow: 'hidden' }}>
      {[...table.rows, null].map((row, i) => (
        <View key={row?.key ?? 'summary'} testID={row ? `drift-row-${row.key}` : undefined} style={{ padding: space.md, gap: 6, borderTopWidth: i ? 1 : 0, borderTopColor: colors.surfaceAlt, backgroundColor: row ? undefined : colors.surfaceAlt }}>
          <View style={{ flexDirection: 'row', justifyContent: 'space-between', gap: space.sm }}>
            <Text variant="label" style={{ flexShrink: 1 }}>{row ? row.label : 'Within tolerances'}</Text>
            {row?.continuous ? <Text variant="small" style={{ fontFamily: font.mono, fontSize: 12 }}>continuous {row.continuous}</Text> : null}
          </View>
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', rowGap: 4 }}>
            {table.methods.map((m) => {
              const cell = row?.cells[m];
              const best = row?.best.includes(m) ?? false;
              const text = row ? cell?.text ?? '—' : `${table.withinTolerance[m] ? 'yes' : 'no'} · best ×${table.wins[m] ?? 0}`;
              const tone = row ? (cell?.beyond ? colors.danger : best ? colors.success : colors.text) : table.withinTolerance[m] ? colors.success : colors.danger;
              return (
                <View key={m} style={{ width: '50%', flexDirection: 'row', alignItems: 'center', gap: 6, paddingVertical: 3, paddingHorizontal: 6, backgroundColor: best ? '#e3f0e5' : undefined, borderRadius: radius.sm }}>
                  <View style={{ width: 8, height: 8, borderRadius: 4, backgroundColor: colors.series[m] }} />
                  <Text variant="small" style={{ color: m === chosen ? colors.primary : colors.textMuted, width: 66 }} numberOfLines={1}>{METHOD_SHORT[m]}</Text>
                  <Text style={{ fontFamily: best ? font.bold : font.mono, fontSize: 12, color: tone, flexShrink: 1 }}>{text}</Text>
                </View>
              );
            })}
          </View>
        </View>
      ))}
    </View>
  );
}
