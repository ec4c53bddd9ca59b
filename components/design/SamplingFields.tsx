import { Pressable, View } from 'react-native';
import { METHOD_NAMES, type MethodName } from '../../schemas/discretize';
import { useTheme } from '../theme';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';
import type { FieldErrors } from './entry';
import { METHOD_LABELS } from './methods';
import type { EditorState, ToleranceName } from './spec';

const numeric = { keyboardType: 'numbers-and-punctuation' as const, autoCapitalize: 'none' as const, autoCorrect: false, inputMode: 'decimal' as const };

interface Props {
  state: EditorState;
  onChange(patch: Partial<EditorState>): void;
  errors: FieldErrors;
  readOnly?: boolean;
  /** defaults the server used, shown as placeholders */
  defaults?: { prewarpHz: number | null; bandHz: number };
}

/** Sample rate, chosen method, prewarp frequency, band and computation delay. */
export function SamplingFields({ state, onChange, errors, readOnly, defaults }: Props) {
  const { space } = useTheme();
  return (
    <View style={{ gap: space.md }}>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.md }}>
        <View style={{ flexGrow: 1, flexBasis: 140 }}>
          <TextField testID="sample-rate" label="Sample rate (Hz)" placeholder="e.g. 500" value={state.sampleRateHz} onChangeText={(sampleRateHz) => onChange({ sampleRateHz })} error={errors.sampleRateHz} editable={!readOnly} {...numeric} />
        </View>
        <View style={{ flexGrow: 1, flexBasis: 140 }}>
          <TextField
            testID="prewarp-hz"
            label="Prewarp frequency (Hz)"
            placeholder={defaults?.prewarpHz ? `default ${defaults.prewarpHz.toPrecision(4)}` : 'default √(|z₁|·|p₁|)'}
            value={state.prewarpHz}
            onChangeText={(prewarpHz) => onChange({ prewarpHz })}
            error={errors.prewarpHz}
            editable={!readOnly}
            {...numeric}
          />
        </View>
        <View style={{ flexGrow: 1, flexBasis: 140 }}>
          <TextField
            testID="band-hz"
            label="Error band up to (Hz)"
            placeholder={defaults ? `default ${defaults.bandHz.toPrecision(4)}` : 'default fs/8'}
            value={state.bandHz}
            onChangeText={(bandHz) => onChange({ bandHz })}
            error={errors.bandHz}
            editable={!readOnly}
            {...numeric}
          />
        </View>
      </View>
      <View style={{ gap: space.xs }}>
        <Text variant="label">Method to implement</Text>
        <MethodPicker value={state.method} onChange={(method) => onChange({ method })} disabled={readOnly} />
      </View>
    </View>
  );
}

/** The five methods as wrapping chips, each with its plot colour. */
export function MethodPicker({ value, onChange, disabled }: { value: MethodName; onChange(m: MethodName): void; disabled?: boolean }) {
  const { colors, radius, space } = useTheme();
  return (
    <View accessibilityRole="radiogroup" testID="method-picker" style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.sm }}>
      {METHOD_NAMES.map((m) => {
        const selected = m === value;
        return (
          <Pressable
            key={m}
            testID={`method-${m}`}
            accessibilityRole="radio"
            accessibilityState={{ checked: selected, disabled: !!disabled }}
            aria-checked={selected}
            disabled={disabled}
            onPress={() => onChange(m)}
            style={{
              flexDirection: 'row',
              alignItems: 'center',
              gap: 6,
              paddingHorizontal: space.md,
              minHeight: 34,
              borderRadius: radius.md,
              borderWidth: 1,
              borderColor: selected ? colors.series[m] : colors.border,
              backgroundColor: selected ? colors.surface : colors.surfaceAlt,
              opacity: disabled && !selected ? 0.6 : 1,
            }}
          >
            <View style={{ width: 10, height: 10, borderRadius: 5, backgroundColor: colors.series[m] }} />
            <Text variant="label" style={{ color: selected ? colors.text : colors.textMuted }}>
              {METHOD_LABELS[m]}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}

const TOLERANCE_FIELDS: { name: ToleranceName; label: string }[] = [
  { name: 'poleDriftPct', label: 'Pole drift (%)' },
  { name: 'dcGainDriftPct', label: 'DC gain drift (%)' },
  { name: 'magErrorDb', label: 'Magnitude error (dB)' },
  { name: 'phaseErrorDeg', label: 'Phase error (deg)' },
];

/** What the reviewer accepts; figures beyond them are marked in the drift table. */
export function ToleranceFields({ state, onChange, errors, readOnly }: Omit<Props, 'defaults'>) {
  const { space } = useTheme();
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.md }}>
      {TOLERANCE_FIELDS.map(({ name, label }) => (
        <View key={name} style={{ flexGrow: 1, flexBasis: 130 }}>
          <TextField
            testID={`tolerance-${name}`}
            label={label}
            value={state.tolerances[name]}
            onChangeText={(v) => onChange({ tolerances: { ...state.tolerances, [name]: v } })}
            error={errors[`tolerances.${name}`]}
            editable={!readOnly}
            {...numeric}
          />
        </View>
      ))}
    </View>
  );
}

/** Computation delay between controller output and plant: none or one sample. */
export function DelayField({ value, onChange, readOnly }: { value: 0 | 1; onChange(v: 0 | 1): void; readOnly?: boolean }) {
  const { space } = useTheme();
  return (
    <View style={{ gap: space.xs }}>
      <Text variant="label">Computation delay</Text>
      <Segmented
        testID="delay-samples"
        accessibilityLabel="Computation delay"
        options={[
          { value: '0', label: 'None' },
          { value: '1', label: 'One sample' },
        ]}
        value={String(value) as '0' | '1'}
        onChange={(v) => onChange(v === '1' ? 1 : 0)}
        disabled={readOnly}
        compact
      />
    </View>
  );
}
