import { View } from 'react-native';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';
import type { EntryFields, EntryForm, FieldErrors, OpAmpFields, OpAmpPart, ParsedContinuous, PlantFields, RootRow, TfFields, ZpkFields } from './entry';
import { buildCompensator, switchForm, zpkToLead } from './entry';
import { fmt } from './format';

/** Names of the entry forms on screen (short: all five fit one row at 390 px). */
const ENTRY_FORM_OPTIONS: { value: EntryForm; label: string }[] = [
  { value: 'lead', label: 'Lead/lag' },
  { value: 'time-constant', label: 'Time const.' },
  { value: 'zpk', label: 'Roots' },
  { value: 'tf', label: 'Coeffs' },
  { value: 'op-amp', label: 'Op-amp' },
];
const PLANT_FORM_OPTIONS: { value: 'zpk' | 'tf'; label: string }[] = [
  { value: 'tf', label: 'Polynomials' },
  { value: 'zpk', label: 'Roots' },
];

const numeric = { keyboardType: 'numbers-and-punctuation' as const, autoCapitalize: 'none' as const, autoCorrect: false, inputMode: 'decimal' as const };

function Row({ children }: { children: React.ReactNode }) {
  const { space } = useTheme();
  return <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.md }}>{children}</View>;
}

function Cell({ children, min = 110 }: { children: React.ReactNode; min?: number }) {
  return <View style={{ flexGrow: 1, flexBasis: min, minWidth: min }}>{children}</View>;
}

interface EntryProps {
  fields: EntryFields;
  onChange(next: EntryFields): void;
  /** keys of entry.ts (no "compensator." prefix) */
  errors: FieldErrors;
  readOnly?: boolean;
  /** the server's parsed H(s), for switching to and from the polynomial form */
  parsed?: ParsedContinuous;
}

/** Compensator entry in any of the four forms; switching form keeps H(s) where it can be written. */
export function CompensatorEntry({ fields, onChange, errors, readOnly, parsed }: EntryProps) {
  const { space } = useTheme();
  return (
    <View style={{ gap: space.md }}>
      <Segmented
        testID="entry-form"
        accessibilityLabel="How to enter the compensator"
        options={ENTRY_FORM_OPTIONS}
        value={fields.form}
        onChange={(form) => onChange(switchForm(form, fields, parsed))}
        disabled={readOnly}
        compact
      />
      {fields.form === 'lead' && (
        <>
          <Text variant="mono" style={{ fontSize: 13 }}>H(s) = K (s + z) / (s + p)</Text>
          <Row>
            <Cell>
              <TextField testID="lead-gain" label="K" value={fields.gain} onChangeText={(gain) => onChange({ ...fields, gain })} error={errors.gain} editable={!readOnly} {...numeric} />
            </Cell>
            <Cell>
              <TextField testID="lead-zero" label="z (rad/s)" value={fields.zero} onChangeText={(zero) => onChange({ ...fields, zero })} error={errors.zero} editable={!readOnly} {...numeric} />
            </Cell>
            <Cell>
              <TextField testID="lead-pole" label="p (rad/s)" value={fields.pole} onChangeText={(pole) => onChange({ ...fields, pole })} error={errors.pole} editable={!readOnly} {...numeric} />
            </Cell>
          </Row>
          <Text variant="small">A lead when z &lt; p, a lag when z &gt; p. K is the root-locus gain; the DC gain is K·z/p.</Text>
        </>
      )}
      {fields.form === 'time-constant' && (
        <>
          <Text variant="mono" style={{ fontSize: 13 }}>H(s) = K (τ₁s + 1) / (τ₂s + 1)</Text>
          <Row>
            <Cell>
              <TextField testID="tc-gain" label="K (DC gain)" value={fields.gain} onChangeText={(gain) => onChange({ ...fields, gain })} error={errors.gain} editable={!readOnly} {...numeric} />
            </Cell>
            <Cell>
              <TextField testID="tc-tau-zero" label="τ₁ (s)" value={fields.tauZero} onChangeText={(tauZero) => onChange({ ...fields, tauZero })} error={errors.tauZero} editable={!readOnly} {...numeric} />
            </Cell>
            <Cell>
              <TextField testID="tc-tau-pole" label="τ₂ (s)" value={fields.tauPole} onChangeText={(tauPole) => onChange({ ...fields, tauPole })} error={errors.tauPole} editable={!readOnly} {...numeric} />
            </Cell>
          </Row>
          <Text variant="small">Zero at −1/τ₁, pole at −1/τ₂, root-locus gain K·τ₁/τ₂.</Text>
        </>
      )}
      {fields.form === 'op-amp' && <OpAmpEntry fields={fields} onChange={onChange} errors={errors} readOnly={readOnly} />}
      {fields.form === 'zpk' && <ZpkEntry prefix="comp" fields={fields} onChange={onChange} errors={errors} readOnly={readOnly} />}
      {fields.form === 'tf' && <TfEntry prefix="comp" fields={fields} onChange={onChange} errors={errors} readOnly={readOnly} />}
    </View>
  );
}

const OP_AMP_LABELS: Record<OpAmpPart, { label: string; placeholder: string }> = {
  r1: { label: 'R1 (Ω)', placeholder: 'e.g. 47k' },
  c1: { label: 'C1 (F)', placeholder: 'e.g. 1u' },
  r2: { label: 'R2 (Ω)', placeholder: 'e.g. 4k7' },
  c2: { label: 'C2 (F)', placeholder: 'e.g. 1u' },
  r3: { label: 'R3 (Ω)', placeholder: 'e.g. 10k' },
  r4: { label: 'R4 (Ω)', placeholder: 'e.g. 22k' },
};

/** The two-op-amp lead/lag network: first stage R1‖C1 in, R2‖C2 back; second stage −R4/R3. */
function OpAmpEntry({ fields, onChange, errors, readOnly }: { fields: OpAmpFields; onChange(f: OpAmpFields): void; errors: FieldErrors; readOnly?: boolean }) {
  const { space } = useTheme();
  const field = (part: OpAmpPart) => (
    <Cell key={part}>
      <TextField
        testID={`opamp-${part}`}
        label={OP_AMP_LABELS[part].label}
        placeholder={OP_AMP_LABELS[part].placeholder}
        value={fields[part]}
        onChangeText={(text) => onChange({ ...fields, [part]: text })}
        error={errors[part]}
        editable={!readOnly}
        autoCapitalize="none"
        autoCorrect={false}
      />
    </Cell>
  );
  const built = buildCompensator(fields).compensator;
  const lead = built ? zpkToLead(built) : null;
  return (
    <View style={{ gap: space.md }}>
      <Text variant="mono" style={{ fontSize: 13 }}>H(s) = (R4·C1)/(R3·C2) · (s + 1/(R1C1)) / (s + 1/(R2C2))</Text>
      <Text variant="label">First stage: input R1 ‖ C1, feedback R2 ‖ C2</Text>
      <Row>{(['r1', 'c1'] as const).map(field)}</Row>
      <Row>{(['r2', 'c2'] as const).map(field)}</Row>
      <Text variant="label">Second stage (inverting): input R3, feedback R4</Text>
      <Row>{(['r3', 'r4'] as const).map(field)}</Row>
      {lead ? (
        <Text variant="mono" style={{ fontSize: 13 }} testID="opamp-hs">
          H(s) = {fmt(lead.gain)} (s + {fmt(lead.zero)}) / (s + {fmt(lead.pole)}) · {lead.zero < lead.pole ? 'lead' : lead.zero > lead.pole ? 'lag' : 'flat'}, DC gain R2R4/(R1R3) = {fmt((lead.gain * lead.zero) / lead.pole)}
        </Text>
      ) : null}
      <Text variant="small">Ohms and farads; prefixes p, n, u, m, k, M, G (m is milli, M mega), also 4k7. A lead when R1C1 &gt; R2C2.</Text>
    </View>
  );
}

interface PlantProps {
  fields: PlantFields;
  onChange(next: PlantFields): void;
  errors: FieldErrors;
  readOnly?: boolean;
}

/** Plant entry: roots or polynomials. */
export function PlantEntry({ fields, onChange, errors, readOnly }: PlantProps) {
  const { space } = useTheme();
  return (
    <View style={{ gap: space.md }}>
      <Segmented
        testID="plant-form"
        accessibilityLabel="How to enter the plant"
        options={PLANT_FORM_OPTIONS}
        value={fields.form}
        onChange={(form) => {
          const next = switchForm(form, fields);
          if (next.form === 'zpk' || next.form === 'tf') onChange(next);
        }}
        disabled={readOnly}
        compact
      />
      {fields.form === 'zpk' ? (
        <ZpkEntry prefix="plant" fields={fields} onChange={onChange} errors={errors} readOnly={readOnly} />
      ) : (
        <TfEntry prefix="plant" fields={fields} onChange={onChange} errors={errors} readOnly={readOnly} />
      )}
    </View>
  );
}

function TfEntry({ prefix, fields, onChange, errors, readOnly }: { prefix: string; fields: TfFields; onChange(f: TfFields): void; errors: FieldErrors; readOnly?: boolean }) {
  const { space } = useTheme();
  return (
    <View style={{ gap: space.md }}>
      <Text variant="small">Coefficients in descending powers of s, separated by commas: “1, 5, 0” is s² + 5s.</Text>
      <TextField testID={`${prefix}-num`} label="Numerator" placeholder="e.g. 8" value={fields.num} onChangeText={(num) => onChange({ ...fields, num })} error={errors.num} editable={!readOnly} autoCapitalize="none" autoCorrect={false} />
      <TextField testID={`${prefix}-den`} label="Denominator" placeholder="e.g. 1, 5, 0" value={fields.den} onChangeText={(den) => onChange({ ...fields, den })} error={errors.den} editable={!readOnly} autoCapitalize="none" autoCorrect={false} />
    </View>
  );
}

function ZpkEntry({ prefix, fields, onChange, errors, readOnly }: { prefix: string; fields: ZpkFields; onChange(f: ZpkFields): void; errors: FieldErrors; readOnly?: boolean }) {
  const { space } = useTheme();
  return (
    <View style={{ gap: space.md }}>
      <Text variant="mono" style={{ fontSize: 13 }}>H(s) = K · Π(s − zᵢ) / Π(s − pᵢ)</Text>
      <View style={{ maxWidth: 220 }}>
        <TextField testID={`${prefix}-gain`} label="K (root-locus gain)" value={fields.gain} onChangeText={(gain) => onChange({ ...fields, gain })} error={errors.gain} editable={!readOnly} {...numeric} />
      </View>
      <RootList title="Zeros" kind="zeros" prefix={prefix} rows={fields.zeros} onChange={(zeros) => onChange({ ...fields, zeros })} errors={errors} readOnly={readOnly} />
      <RootList title="Poles" kind="poles" prefix={prefix} rows={fields.poles} onChange={(poles) => onChange({ ...fields, poles })} errors={errors} readOnly={readOnly} />
      <Text variant="small">Roots in rad/s. A row with an imaginary part is the conjugate pair re ± j·im.</Text>
    </View>
  );
}

function RootList({ title, kind, prefix, rows, onChange, errors, readOnly }: { title: string; kind: 'zeros' | 'poles'; prefix: string; rows: RootRow[]; onChange(rows: RootRow[]): void; errors: FieldErrors; readOnly?: boolean }) {
  const { colors, space } = useTheme();
  const set = (i: number, row: RootRow) => onChange(rows.map((r, j) => (j === i ? row : r)));
  return (
    <View style={{ gap: space.sm }}>
      <Text variant="label">{title}</Text>
      {errors[kind] ? (
        <Text variant="small" tone="danger" testID={`${prefix}-${kind}-error`}>
          {errors[kind]}
        </Text>
      ) : null}
      {rows.length === 0 ? <Text variant="small">None.</Text> : null}
      {rows.map((row, i) => (
        <View key={i} style={{ gap: 2 }}>
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: space.sm }}>
            <View style={{ flex: 1, minWidth: 70 }}>
              <TextField testID={`${prefix}-${kind}-${i}-re`} label={`re ${i + 1}`} value={row.re} onChangeText={(re) => set(i, { ...row, re })} editable={!readOnly} {...numeric} />
            </View>
            <Text style={{ marginTop: 20, color: colors.textMuted }}>± j</Text>
            <View style={{ flex: 1, minWidth: 70 }}>
              <TextField testID={`${prefix}-${kind}-${i}-im`} label="im" placeholder="0" value={row.im} onChangeText={(im) => set(i, { ...row, im })} editable={!readOnly} {...numeric} />
            </View>
            {!readOnly && (
              <Button label="Remove" kind="quiet" compact onPress={() => onChange(rows.filter((_, j) => j !== i))} style={{ marginTop: 20 }} accessibilityLabel={`Remove ${title.toLowerCase()} row ${i + 1}`} />
            )}
          </View>
          {errors[`${kind}.${i}`] ? (
            <Text variant="small" tone="danger" testID={`${prefix}-${kind}-${i}-error`}>
              {errors[`${kind}.${i}`]}
            </Text>
          ) : null}
        </View>
      ))}
      {!readOnly && (
        <Button label={`Add ${kind === 'zeros' ? 'a zero' : 'a pole'}`} kind="secondary" compact onPress={() => onChange([...rows, { re: '', im: '' }])} style={{ alignSelf: 'flex-start' }} testID={`${prefix}-${kind}-add`} />
      )}
    </View>
  );
}
