import { useMemo, useState } from 'react';
import { Pressable, View } from 'react-native';
import { METHOD_NAMES, type DiscretizeResponse, type MethodName } from '../../schemas/discretize';
import type { Tolerances } from '../../schemas/design';
import { BodePlot, type BodeSeries } from '../plots/BodePlot';
import { PoleZeroMap, type RootSeries } from '../plots/PoleZeroMap';
import { StepPlot, type StepSeries } from '../plots/StepPlot';
import { useLayoutWidth } from '../plots/useLayoutWidth';
import { useTheme } from '../theme';
import { Card } from '../ui/Card';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { buildDriftTable } from './drift';
import { DriftTableView } from './DriftTableView';
import { differenceEquation, fmt, polyS, polyZinv, zpkText } from './format';
import { METHOD_LABELS } from './methods';
import type { SkippedMethod } from './spec';

interface Props {
  answer: DiscretizeResponse;
  chosen: MethodName;
  tolerances: Tolerances;
  skipped: SkippedMethod[];
  /** the answer is for an older input (a newer one is being computed or was refused) */
  stale?: boolean;
}

/** Echo of H(s) and H(z), plots, drift table and warnings for one compute answer. */
export function AnalysisPanel({ answer, chosen, tolerances, skipped, stale }: Props) {
  const { colors, space } = useTheme();
  const available = METHOD_NAMES.filter((m) => answer.methods[m]);
  const [hidden, setHidden] = useState<Partial<Record<MethodName, boolean>>>({});
  const [zoomZ, setZoomZ] = useState(false);
  const shown = available.filter((m) => !hidden[m]);
  const { width, onLayout } = useLayoutWidth();
  const twoUp = width >= 640;
  const half = twoUp ? Math.floor((width - space.lg) / 2) : width;
  const table = useMemo(() => buildDriftTable(answer, tolerances), [answer, tolerances]);

  const bode: BodeSeries[] = [
    { key: 'continuous', label: 'Continuous H(s)', color: colors.series.continuous, freqHz: answer.frequencyHz, magDb: answer.continuous.response.magnitudeDb, phaseDeg: answer.continuous.response.phaseDeg },
    ...shown.map((m) => ({
      key: m,
      label: METHOD_LABELS[m],
      color: colors.series[m],
      dashed: m !== chosen,
      freqHz: answer.frequencyHz,
      magDb: answer.methods[m]!.response.magnitudeDb,
      phaseDeg: answer.methods[m]!.response.phaseDeg,
    })),
  ];
  const zSeries: RootSeries[] = shown.map((m) => ({ key: m, label: METHOD_LABELS[m], color: colors.series[m], poles: answer.methods[m]!.poles, zeros: answer.methods[m]!.zeros }));
  const sSeries: RootSeries[] = [
    { key: 'continuous', label: 'Continuous', color: colors.series.continuous, poles: answer.continuous.poles, zeros: answer.continuous.zeros },
    ...shown.map((m) => ({
      key: m,
      label: `${METHOD_LABELS[m]} (ln z / T)`,
      color: colors.series[m],
      poles: answer.methods[m]!.poleInfo.flatMap((p) => (p.s ? [p.s] : [])),
      zeros: answer.methods[m]!.zeroInfo.flatMap((p) => (p.s ? [p.s] : [])),
    })),
  ];
  const cl = answer.continuousLoop;
  const steps: StepSeries[] = cl
    ? [
        { key: 'continuous', label: 'Continuous loop', color: colors.series.continuous, timeS: cl.step.timeSec, y: cl.step.output },
        ...shown.flatMap((m) => {
          const loop = answer.methods[m]!.loop;
          return loop ? [{ key: m, label: METHOD_LABELS[m], color: colors.series[m], timeS: loop.step.timeSec, y: loop.step.output, sampled: true }] : [];
        }),
      ]
    : [];
  const chosenResult = answer.methods[chosen];
  const c = answer.continuous;

  return (
    <View onLayout={onLayout} style={{ gap: space.lg, opacity: stale ? 0.55 : 1 }} testID="analysis-panel">
      <Card testID="tf-echo">
        <Text variant="overline">As understood</Text>
        <Echo label="H(s)" lines={[zpkText(c.gain, c.zeros, c.poles), `(${polyS(c.numDescending)}) / (${polyS(c.denDescending)})`]} />
        {chosenResult ? (
          <Echo
            label={`H(z), ${METHOD_LABELS[chosen]}`}
            lines={[`(${polyZinv(chosenResult.num)}) / (${polyZinv(chosenResult.den)})`, differenceEquation(chosenResult.num, chosenResult.den)]}
            testID="hz-echo"
          />
        ) : (
          <Text variant="small" tone="warning">{METHOD_LABELS[chosen]} was not computed for this input.</Text>
        )}
        <Text variant="small">
          T = {fmt(answer.periodSec, 4)} s · Nyquist {fmt(answer.nyquistHz, 4)} Hz · DC gain {c.dcGain === null ? '∞' : fmt(c.dcGain, 5)}
          {answer.prewarpHz !== null ? ` · prewarp ${fmt(answer.prewarpHz, 4)} Hz` : ''}. H(z) coefficients are in ascending powers of z⁻¹.
        </Text>
      </Card>

      {(answer.warnings.length > 0 || skipped.length > 0) && (
        <Card tone="notice" testID="analysis-warnings">
          {answer.warnings.map((w) => (
            <Text key={w.code + w.message} variant="small" style={{ color: colors.text }}>
              <Text variant="label" style={{ color: colors.warning }}>{w.code}</Text>  {w.message}
            </Text>
          ))}
          {skipped.map((s) => (
            <Text key={s.method} variant="small" style={{ color: colors.text }}>
              <Text variant="label" style={{ color: colors.warning }}>{METHOD_LABELS[s.method]}</Text>  {s.reason}
            </Text>
          ))}
        </Card>
      )}

      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'center' }}>
        <Text variant="label">Show in plots:</Text>
        {available.map((m) => (
          <Pressable
            key={m}
            testID={`plot-toggle-${m}`}
            accessibilityRole="checkbox"
            accessibilityState={{ checked: !hidden[m] }}
            onPress={() => setHidden((h) => ({ ...h, [m]: !h[m] }))}
            style={{ flexDirection: 'row', alignItems: 'center', gap: 6, paddingHorizontal: 10, minHeight: 30, borderRadius: 15, borderWidth: 1, borderColor: hidden[m] ? colors.border : colors.series[m], backgroundColor: hidden[m] ? 'transparent' : colors.surface }}
          >
            <View style={{ width: 9, height: 9, borderRadius: 5, backgroundColor: hidden[m] ? colors.border : colors.series[m] }} />
            <Text variant="small" style={{ color: hidden[m] ? colors.textMuted : colors.text }}>{METHOD_LABELS[m]}</Text>
          </Pressable>
        ))}
      </View>

      <Card>
        <Text variant="title">Bode plot</Text>
        <Text variant="small">Continuous solid black; the chosen method solid, the others dashed. The shaded band is where the largest errors are measured.</Text>
        <BodePlot testID="bode-plot" width={Math.max(0, width - 2 * space.lg - 2)} series={bode} nyquistHz={answer.nyquistHz} bandHz={answer.bandHz} />
      </Card>

      <View style={{ flexDirection: twoUp ? 'row' : 'column', gap: space.lg }}>
        <Card style={{ width: half }}>
          <Text variant="title">z-plane</Text>
          <Text variant="small">Poles ×, zeros ○; dashed: the unit circle.</Text>
          <Segmented
            testID="zplane-frame"
            accessibilityLabel="z-plane framing"
            options={[
              { value: 'circle', label: 'Unit circle' },
              { value: 'roots', label: 'Near the roots' },
            ]}
            value={zoomZ ? 'roots' : 'circle'}
            onChange={(v) => setZoomZ(v === 'roots')}
            compact
          />
          <PoleZeroMap testID="zplane-plot" plane="z" zoom={zoomZ} width={Math.max(0, half - 2 * space.lg - 2)} series={zSeries} />
        </Card>
        <Card style={{ width: half }}>
          <Text variant="title">s-plane</Text>
          <Text variant="small">Continuous roots and each method's equivalent roots ln z / T.</Text>
          <PoleZeroMap testID="splane-plot" plane="s" width={Math.max(0, half - 2 * space.lg - 2)} series={sSeries} />
        </Card>
      </View>

      {cl && (
        <Card>
          <Text variant="title">Closed-loop step response</Text>
          <Text variant="small">Unit step of the reference, negative unity feedback; the plant discretized by zero-order hold{answer.delaySamples ? ', one sample of computation delay' : ''}.</Text>
          <StepPlot testID="step-plot" width={Math.max(0, width - 2 * space.lg - 2)} series={steps} />
        </Card>
      )}

      <Card>
        <Text variant="title">Drift by method</Text>
        <DriftTableView testID="drift-table" table={table} chosen={chosen} />
      </Card>
    </View>
  );
}

function Echo({ label, lines, testID }: { label: string; lines: string[]; testID?: string }) {
  const { space } = useTheme();
  return (
    <View style={{ gap: 2 }} testID={testID}>
      <Text variant="label">{label} =</Text>
      {lines.map((l, i) => (
        <Text key={i} variant="mono" selectable style={{ fontSize: 13, paddingLeft: space.md }}>
          {l}
        </Text>
      ))}
    </View>
  );
}
