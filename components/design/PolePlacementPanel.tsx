import { useEffect, useMemo, useState } from 'react';
import { View } from 'react-native';
import type { CompensatorInput } from '../../schemas/compensator';
import type { LeadPlacementRequestBody, LeadPlacementResponse, PlacementRule } from '../../schemas/lead-placement';
import { isApiRequestError } from '../data/api';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';
import { parseNumber, type FieldErrors } from './entry';
import { fmt } from './format';
import { useLeadPlacement } from './queries';

const RULE_OPTIONS: { value: PlacementRule; label: string }[] = [
  { value: 'bisector', label: 'Bisector' },
  { value: 'zero-at', label: 'Zero fixed' },
];
const numeric = { keyboardType: 'numbers-and-punctuation' as const, autoCapitalize: 'none' as const, autoCorrect: false, inputMode: 'decimal' as const };

interface Props {
  /** the editor's plant when it is switched on and parses; null otherwise */
  plant: CompensatorInput | null;
  /** whether the editor's plant is switched on (it may still have errors) */
  plantOn: boolean;
  /** switch the editor's plant on */
  onAskPlant(): void;
  /** fill the lead form: K(s + zero)/(s + pole), rad/s */
  onUseLead(lead: { gain: number; zero: number; pole: number }): void;
}

/** Text fields → request body, or field errors. Pure. */
export function placementBody(plant: CompensatorInput, zeta: string, wn: string, rule: PlacementRule, zero: string): { body?: LeadPlacementRequestBody; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const z = parseNumber(zeta);
  const w = parseNumber(wn);
  if (typeof z === 'string') errors.zeta = z;
  if (typeof w === 'string') errors.wn = w;
  let zr: number | undefined;
  if (rule === 'zero-at') {
    const v = parseNumber(zero);
    if (typeof v === 'string') errors.zero = v;
    else zr = v;
  }
  if (Object.keys(errors).length > 0) return { errors };
  return { body: { plant, zeta: z as number, wn: w as number, rule, ...(zr !== undefined ? { zero: zr } : {}) }, errors };
}

/**
 * "Place the closed-loop poles": the lead K(s + z)/(s + p) that puts a closed-loop pole pair at
 * a target ζ and ωn with the editor's plant (POST /api/v1/lead-placement), and a button that
 * copies it into the lead form.
 */
export function PolePlacementPanel({ plant, plantOn, onAskPlant, onUseLead }: Props) {
  const { colors, space } = useTheme();
  const [zeta, setZeta] = useState('');
  const [wn, setWn] = useState('');
  const [rule, setRule] = useState<PlacementRule>('bisector');
  const [zero, setZero] = useState('');
  const [local, setLocal] = useState<FieldErrors>({});
  const place = useLeadPlacement();
  const plantKey = useMemo(() => JSON.stringify(plant), [plant]);
  const { reset } = place;
  // an answer for another plant or target must not be used
  useEffect(() => reset(), [plantKey, zeta, wn, rule, zero, reset]);

  const refused = place.error && isApiRequestError(place.error, 400) ? place.error : null;
  const serverErrors: FieldErrors = {};
  for (const i of refused?.issues ?? []) if (!(i.path in serverErrors)) serverErrors[i.path] = i.message;
  const errors = { ...serverErrors, ...local };
  const plantIssues = (refused?.issues ?? []).filter((i) => i.path.startsWith('plant'));

  const run = () => {
    if (!plant) return;
    const { body, errors: e } = placementBody(plant, zeta, wn, rule, zero);
    setLocal(e);
    if (body) place.mutate(body);
  };

  return (
    <Card tone="muted" testID="place-panel">
      <View style={{ gap: 2 }}>
        <Text variant="bodyMedium">Place the closed-loop poles</Text>
        <Text variant="small">The lead that puts a closed-loop pole pair at s = −ζωn ± jωn√(1 − ζ²) with the plant below (negative unity feedback).</Text>
      </View>
      {!plant ? (
        <View style={{ gap: space.sm }}>
          <Text variant="small" style={{ color: colors.text }} testID="place-needs-plant">
            {plantOn ? 'Complete the plant in the Plant section first.' : 'This needs the plant G(s).'}
          </Text>
          {!plantOn && <Button testID="place-add-plant" label="Enter the plant" kind="secondary" compact onPress={onAskPlant} style={{ alignSelf: 'flex-start' }} />}
        </View>
      ) : (
        <>
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.md }}>
            <View style={{ flexGrow: 1, flexBasis: 110, minWidth: 110 }}>
              <TextField testID="place-zeta" label="ζ (damping ratio)" placeholder="e.g. 0.6" value={zeta} onChangeText={setZeta} error={errors.zeta} {...numeric} />
            </View>
            <View style={{ flexGrow: 1, flexBasis: 110, minWidth: 110 }}>
              <TextField testID="place-wn" label="ωn (rad/s)" placeholder="e.g. 5" value={wn} onChangeText={setWn} error={errors.wn} {...numeric} />
            </View>
          </View>
          <Segmented testID="place-rule" accessibilityLabel="How to place the zero" options={RULE_OPTIONS} value={rule} onChange={(v: PlacementRule) => setRule(v)} compact />
          {rule === 'zero-at' ? (
            <View style={{ maxWidth: 220 }}>
              <TextField testID="place-zero" label="z (rad/s), zero at s = −z" placeholder="e.g. under a plant pole" value={zero} onChangeText={setZero} error={errors.zero} {...numeric} />
            </View>
          ) : (
            <Text variant="small">Bisector: zero and pole placed symmetrically about the bisector of the angle at the target, the smallest pole/zero spread for the angle needed.</Text>
          )}
          {errors.rule ? <Text variant="small" tone="danger">{errors.rule}</Text> : null}
          <Button testID="place-run" label="Find the lead" compact onPress={run} busy={place.isPending} style={{ alignSelf: 'flex-start' }} />
          {refused ? (
            <Text variant="small" tone="danger" testID="place-refused">
              {refused.message}
              {plantIssues.map((i) => ` ${i.path}: ${i.message}`).join('')}
            </Text>
          ) : place.error ? (
            <Text variant="small" tone="danger">{place.error.message}</Text>
          ) : null}
          {place.data ? <PlacementResult answer={place.data} onUse={() => onUseLead({ gain: place.data.gain, zero: place.data.zero, pole: place.data.pole })} /> : null}
        </>
      )}
    </Card>
  );
}

function complexText(c: { re: number; im: number }): string {
  if (c.im === 0) return fmt(c.re, 5);
  return `${fmt(c.re, 5)} ${c.im < 0 ? '−' : '+'} j${fmt(Math.abs(c.im), 5)}`;
}

function PlacementResult({ answer, onUse }: { answer: LeadPlacementResponse; onUse(): void }) {
  const { colors, space } = useTheme();
  const row = (label: string, value: string) => (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.sm }}>
      <Text variant="small" style={{ minWidth: 150 }}>{label}</Text>
      <Text variant="mono" style={{ fontSize: 13, flexShrink: 1 }}>{value}</Text>
    </View>
  );
  return (
    <View testID="place-result" style={{ gap: space.xs, borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.md }}>
      <Text variant="mono" style={{ fontSize: 13 }}>
        C(s) = {fmt(answer.gain)} (s + {fmt(answer.zero)}) / (s + {fmt(answer.pole)})
      </Text>
      {row('Target s_d', complexText(answer.sDesired))}
      {row('Angle to supply φ', `${fmt(answer.angleDeficiencyDeg, 5)}°`)}
      {row('z, p (rad/s)', `${fmt(answer.zero)}, ${fmt(answer.pole)}`)}
      {row('K', fmt(answer.gain))}
      {row('Check ∠CG(s_d)', `${fmt(answer.check.angleDeg, 10)}°`)}
      {row('Check |CG(s_d)|', fmt(answer.check.magnitude, 10))}
      {row('Closed-loop poles', answer.closedLoopPoles.map(complexText).join(',  '))}
      <Text variant="small" tone={answer.dominantOk ? 'success' : 'warning'} testID="place-dominance">
        {answer.dominantOk ? 'The target pair is the closest to the imaginary axis (dominant).' : 'The target pair is not dominant.'}
      </Text>
      {answer.dominanceNotes.map((n) => (
        <Text key={n} variant="small">
          {n}
        </Text>
      ))}
      <Button testID="place-use" label="Use this lead" compact onPress={onUse} style={{ alignSelf: 'flex-start', marginTop: space.sm }} />
    </View>
  );
}
