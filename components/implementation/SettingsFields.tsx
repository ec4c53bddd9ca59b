import { View, useWindowDimensions } from 'react-native';
import { useTheme } from '../theme';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';
import { STRUCTURE_LABELS } from './display';
import { structuresFor, withWordLength, type SettingsErrors, type SettingsForm, type WordLengthChoice } from './settings-form';

const WORD_OPTIONS: { value: WordLengthChoice; label: string }[] = [
  { value: '16', label: '16-bit' },
  { value: '32', label: '32-bit' },
  { value: 'float32', label: 'float32' },
];

const WORD_HINTS: Record<WordLengthChoice, string> = {
  '16': 'int16_t data, 32-bit accumulator. Fits most small parts.',
  '32': 'int32_t data, 64-bit accumulator. For poles close to z = 1.',
  float32: 'Single-precision float, for parts with an FPU.',
};

interface Props {
  form: SettingsForm;
  onChange(form: SettingsForm): void;
  errors: SettingsErrors;
  readOnly: boolean;
}

/** Word length, scaling, output limits, C prefix and structure. */
export function SettingsFields({ form, onChange, errors, readOnly }: Props) {
  const { space } = useTheme();
  const { width } = useWindowDimensions();
  const pair = width >= 480;
  const float = form.wordLength === 'float32';
  const set = (p: Partial<SettingsForm>) => onChange({ ...form, ...p });
  const row = { flexDirection: pair ? ('row' as const) : ('column' as const), gap: space.md };
  const cell = pair ? { flex: 1, minWidth: 0 } : undefined;

  return (
    <View style={{ gap: space.lg }}>
      <View style={{ gap: space.xs }}>
        <Text variant="label">Word length</Text>
        <Segmented testID="impl-word-length" accessibilityLabel="Word length" options={WORD_OPTIONS} value={form.wordLength} onChange={(v) => onChange(withWordLength(form, v))} disabled={readOnly} />
        <Text variant="small">{WORD_HINTS[form.wordLength]}</Text>
        {errors.wordLength ? <Text variant="small" tone="danger" testID="impl-word-length-error">{errors.wordLength}</Text> : null}
      </View>

      <View style={row}>
        <View style={cell}>
          <TextField
            testID="impl-input-scale"
            label="Input scale (real units per count)"
            hint="e.g. ADC volts per count: 3.3/4096"
            value={form.inputScale}
            onChangeText={(inputScale) => set({ inputScale })}
            error={errors.inputScale}
            editable={!readOnly}
            inputMode="decimal"
            autoCapitalize="none"
            autoCorrect={false}
          />
        </View>
        <View style={cell}>
          <TextField
            testID="impl-output-scale"
            label="Output scale (real units per count)"
            hint="e.g. PWM duty per count: 1/1000"
            value={form.outputScale}
            onChangeText={(outputScale) => set({ outputScale })}
            error={errors.outputScale}
            editable={!readOnly}
            inputMode="decimal"
            autoCapitalize="none"
            autoCorrect={false}
          />
        </View>
      </View>

      <View style={{ gap: space.xs }}>
        <View style={row}>
          <View style={cell}>
            <TextField
              testID="impl-limit-min"
              label={float ? 'Lowest output (real units)' : 'Lowest output (counts)'}
              value={form.limitMin}
              onChangeText={(limitMin) => set({ limitMin })}
              error={errors.limitMin}
              editable={!readOnly}
              inputMode="decimal"
              autoCorrect={false}
            />
          </View>
          <View style={cell}>
            <TextField
              testID="impl-limit-max"
              label={float ? 'Highest output (real units)' : 'Highest output (counts)'}
              value={form.limitMax}
              onChangeText={(limitMax) => set({ limitMax })}
              error={errors.limitMax}
              editable={!readOnly}
              inputMode="decimal"
              autoCorrect={false}
            />
          </View>
        </View>
        <Text variant="small">The output saturates at these limits. {float ? 'float32 builds limit in real output units.' : 'Raw counts of the output word, e.g. 0 … 1000 for a PWM compare register.'}</Text>
      </View>

      <TextField
        testID="impl-prefix"
        label="C prefix"
        hint={`Names the files, the state type and the functions: ${form.prefix.trim() || 'prefix'}_step()`}
        value={form.prefix}
        onChangeText={(prefix) => set({ prefix })}
        error={errors.prefix}
        editable={!readOnly}
        autoCapitalize="none"
        autoCorrect={false}
        maxLength={40}
      />

      <View style={{ gap: space.xs }}>
        <Text variant="label">Structure</Text>
        <Segmented
          testID="impl-structure"
          accessibilityLabel="Structure"
          options={structuresFor(form.wordLength).map((value) => ({ value, label: STRUCTURE_LABELS[value] }))}
          value={form.structure}
          onChange={(structure) => set({ structure })}
          disabled={readOnly}
          compact
        />
        <Text variant="small">
          {float
            ? 'Float builds use transposed direct form II.'
            : 'Direct form I keeps one accumulator per section. The offset form stores feedback coefficients as small offsets from 1, which keeps poles near z = 1 accurate at high sample rates.'}
        </Text>
        {errors.structure ? <Text variant="small" tone="danger" testID="impl-structure-error">{errors.structure}</Text> : null}
      </View>
    </View>
  );
}
