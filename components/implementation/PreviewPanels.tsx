import { useState } from 'react';
import { View } from 'react-native';
import type { Structure, WordLength } from '../../schemas/implementation';
import type { ImplementationAnalysisWire, ImplementationWarning } from '../../schemas/implementation-api';
import { fmt } from '../design/format';
import { PoleZeroMap, type RootSeries } from '../plots/PoleZeroMap';
import { useLayoutWidth } from '../plots/useLayoutWidth';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import {
  choiceLabel,
  coefficientLabel,
  dbText,
  formatOfCoefficient,
  improvementFactor,
  pctText,
  stabilityText,
  STRUCTURE_SHORT,
  wordLengthLabel,
  zText,
} from './display';
import { FigureTable, type FigureColumn, type FigureRow } from './FigureTable';

type Analysis = ImplementationAnalysisWire;

export function PanelTitle({ title, hint }: { title: string; hint?: string }) {
  return (
    <View style={{ gap: 2 }}>
      <Text variant="title">{title}</Text>
      {hint ? <Text variant="small">{hint}</Text> : null}
    </View>
  );
}

// ---------------------------------------------------------------- coefficients

const COEF_COLUMNS: FigureColumn[] = [
  { key: 'section', title: 'Sec.', width: 50 },
  { key: 'name', title: 'Coef.', width: 54 },
  { key: 'format', title: 'Format', width: 70 },
  { key: 'exact', title: 'Exact', width: 112, numeric: true },
  { key: 'integer', title: 'Integer', width: 92, numeric: true },
  { key: 'quantized', title: 'Quantized', width: 112, numeric: true },
  { key: 'error', title: 'Error', width: 84, numeric: true },
  { key: 'bits', title: 'Bits', width: 50, numeric: true },
];

/** Exact, quantized integer, error and significant bits of every coefficient, section by section. */
export function CoefficientsPanel({ analysis }: { analysis: Analysis }) {
  const float = analysis.wordLength === 'float32';
  const columns = float ? COEF_COLUMNS.filter((c) => c.key !== 'integer') : COEF_COLUMNS;
  const rows: FigureRow[] = analysis.coefficients.map((c) => ({
    key: `${c.section}-${c.name}`,
    testID: `impl-coef-${c.section}-${c.name}`,
    tone: c.exact !== 0 && c.significantBits < 4 ? 'bad' : 'plain',
    cells: {
      section: String(c.section),
      name: coefficientLabel(c.name),
      format: formatOfCoefficient(analysis.sections, c),
      exact: fmt(c.exact, 8),
      integer: c.integer === null ? '—' : String(c.integer),
      quantized: fmt(c.quantized, 8),
      error: c.error === 0 ? '0' : fmt(c.error, 3),
      bits: String(c.significantBits),
    },
  }));
  const sections = analysis.sections.map((s) => `section ${s.index} (order ${s.order}): ${s.formats.join(' + ')}`).join(' · ');
  return (
    <Card testID="impl-coefficients">
      <PanelTitle
        title="Coefficients"
        hint={`${choiceLabel(analysis)}, ${analysis.sections.length} section${analysis.sections.length === 1 ? '' : 's'}; scaling folded in (input scale ÷ output scale = ${fmt(analysis.gainFold, 6)}). Bits: significant bits of the stored integer; rows in red keep fewer than 4.`}
      />
      <FigureTable columns={columns} rows={rows} />
      <Text variant="small">Formats per section: {sections}</Text>
    </Card>
  );
}

// ---------------------------------------------------------------- roots

const ROOT_COLUMNS: FigureColumn[] = [
  { key: 'kind', title: 'Root', width: 70 },
  { key: 'ideal', title: 'Ideal z', width: 170, numeric: true },
  { key: 'quantized', title: 'Quantized z', width: 170, numeric: true },
  { key: 'driftZ', title: '|Δz|', width: 80, numeric: true },
  { key: 'driftPct', title: 'Drift of s', width: 92, numeric: true },
];

const FRAME_OPTIONS: { value: 'whole' | 'close'; label: string }[] = [
  { value: 'whole', label: 'Unit circle' },
  { value: 'close', label: 'Close to the roots' },
];

/** Ideal and quantized poles and zeros on one z-plane map, with their drift in numbers. */
export function RootsPanel({ analysis }: { analysis: Analysis }) {
  const { colors } = useTheme();
  const { width, onLayout } = useLayoutWidth();
  const lostOrKept = (r: { re: number | null; im: number | null }): r is { re: number; im: number } => r.re !== null && r.im !== null;
  const series: RootSeries[] = [
    { key: 'ideal', label: 'Ideal discrete', color: colors.textMuted, poles: analysis.poles.map((p) => p.ideal), zeros: analysis.zeros.map((z) => z.ideal) },
    {
      key: 'quantized',
      label: `Quantized (${wordLengthLabel(analysis.wordLength)})`,
      color: colors.danger,
      poles: analysis.poles.map((p) => p.quantized).filter(lostOrKept),
      zeros: analysis.zeros.map((z) => z.quantized).filter(lostOrKept),
    },
  ];
  // roots crowd near z = 1 at high sample rates: frame them closely from the start there
  const crowded = analysis.poles.some((p) => Math.hypot(p.ideal.re - 1, p.ideal.im) < 0.05);
  const [frame, setFrame] = useState<'whole' | 'close'>(crowded ? 'close' : 'whole');
  const tol = analysis.tolerances.poleDriftPct;
  const rows: FigureRow[] = [
    ...analysis.poles.map((p, i) => ({ p, kind: 'pole', i })),
    ...analysis.zeros.map((p, i) => ({ p, kind: 'zero', i })),
  ].map(({ p, kind, i }) => ({
    key: `${kind}-${i}`,
    tone: kind === 'pole' && p.driftPct !== null && p.driftPct > tol ? 'bad' : 'plain',
    cells: {
      kind: `${kind} ${p.section}`,
      ideal: zText(p.ideal.re, p.ideal.im),
      quantized: zText(p.quantized.re, p.quantized.im),
      driftZ: p.driftZ === null ? '—' : p.driftZ === 0 ? '0' : fmt(p.driftZ, 3),
      driftPct: p.driftPct === null ? '—' : pctText(p.driftPct),
    },
  }));
  const m = analysis.metrics;
  return (
    <Card testID="impl-roots">
      <PanelTitle title="Quantized poles and zeros" hint="× poles, ○ zeros; where the two coincide only the quantized marker shows. Drift of s: |ln z_q − ln z| as a percentage of |ln z|, the equivalent s-plane root." />
      <Segmented<'whole' | 'close'>
        testID="impl-pz-frame"
        accessibilityLabel="Map framing"
        options={FRAME_OPTIONS}
        value={frame}
        onChange={setFrame}
        compact
      />
      <View onLayout={onLayout}>
        <PoleZeroMap width={width} plane="z" series={series} zoom={frame === 'close'} testID="impl-pz-map" />
      </View>
      <FigureTable columns={ROOT_COLUMNS} rows={rows} />
      <Text variant="small" testID="impl-metrics" style={{ color: colors.text }}>
        DC gain {m.dcGainIdeal === null ? '∞' : fmt(m.dcGainIdeal, 6)} → {m.dcGainQuantized === null ? '∞' : fmt(m.dcGainQuantized, 6)} (drift {pctText(m.dcGainDriftPct, 'n/a')}); largest response error {dbText(m.responseErrorDb)};{' '}
        {stabilityText(analysis.poles)}.
      </Text>
    </Card>
  );
}

// ---------------------------------------------------------------- advice

const ADVICE_COLUMNS: FigureColumn[] = [
  { key: 'choice', title: 'Word length and structure', width: 206 },
  { key: 'pole', title: 'Pole drift', width: 94, numeric: true },
  { key: 'dc', title: 'DC-gain drift', width: 106, numeric: true },
  { key: 'resp', title: 'Resp. error', width: 104, numeric: true },
  { key: 'ok', title: 'Tolerances', width: 84 },
];

interface AdviceProps {
  analysis: Analysis;
  /** offered when the form can be changed: apply a word length and structure */
  onUse?: (c: { wordLength: WordLength; structure: Structure }) => void;
}

/** The word-length advice, every candidate in numbers, and what the offset form gains. */
export function AdvicePanel({ analysis, onUse }: AdviceProps) {
  const { colors, space } = useTheme();
  const rec = analysis.advice.recommended;
  const current = { wordLength: analysis.wordLength, structure: analysis.structure };
  const isCurrent = (c: { wordLength: WordLength; structure: Structure }) => c.wordLength === current.wordLength && c.structure === current.structure;
  const t = analysis.tolerances;
  const rows: FigureRow[] = analysis.advice.candidates.map((c) => ({
    key: `${c.wordLength}-${c.structure}`,
    tone: rec && c.wordLength === rec.wordLength && c.structure === rec.structure ? 'good' : 'plain',
    testID: `impl-candidate-${c.wordLength}-${c.structure}`,
    cells: {
      choice: `${choiceLabel(c)}${isCurrent(c) ? ' (now)' : ''}`,
      pole: pctText(c.metrics.poleDriftPct),
      dc: pctText(c.metrics.dcGainDriftPct, 'n/a'),
      resp: dbText(c.metrics.responseErrorDb),
      ok: c.meetsTolerances ? 'within' : 'outside',
    },
  }));
  const of = analysis.advice.offsetForm;
  return (
    <Card testID="impl-advice">
      <PanelTitle title="Word-length advice" hint={`Tolerances: pole drift ${t.poleDriftPct} %, DC-gain drift ${t.dcGainDriftPct} %, response error ${t.responseErrorDb} dB.`} />
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md }}>
        <Text variant="bodyMedium" testID="impl-advice-recommended" style={{ flexShrink: 1 }}>
          {rec
            ? isCurrent(rec)
              ? `These settings are the smallest that meet every tolerance: ${choiceLabel(rec)}.`
              : `Smallest that meets every tolerance: ${choiceLabel(rec)}.`
            : 'No offered word length meets every tolerance; lower the sample rate or widen the tolerances.'}
        </Text>
        {rec && !isCurrent(rec) && onUse ? <Button testID="impl-advice-use" label={`Use ${choiceLabel(rec)}`} kind="secondary" compact onPress={() => onUse(rec)} /> : null}
      </View>
      <FigureTable columns={ADVICE_COLUMNS} rows={rows} />
      {of ? (
        <View testID="impl-offset-form" style={{ gap: 4, borderLeftWidth: 3, borderLeftColor: colors.primary, paddingLeft: space.md }}>
          <Text variant="label">Offset form at {of.wordLength} bits, against direct form I</Text>
          <OffsetLine label="DC-gain drift" before={of.directForm.dcGainDriftPct} after={of.offsetForm.dcGainDriftPct} text={(v) => pctText(v, 'n/a')} />
          <OffsetLine label="Pole drift" before={of.directForm.poleDriftPct} after={of.offsetForm.poleDriftPct} text={(v) => pctText(v)} />
          <OffsetLine label="Response error" before={of.directForm.responseErrorDb} after={of.offsetForm.responseErrorDb} text={dbText} />
          {analysis.structure !== 'offset-form-1' && onUse ? (
            <Button testID="impl-offset-use" label="Use the offset form" kind="quiet" compact style={{ alignSelf: 'flex-start' }} onPress={() => onUse({ wordLength: of.wordLength, structure: 'offset-form-1' })} />
          ) : null}
        </View>
      ) : analysis.wordLength !== 'float32' ? (
        <Text variant="small">The offset form would not improve these figures 4-fold or more here; {STRUCTURE_SHORT['direct-form-1']} is enough.</Text>
      ) : null}
    </Card>
  );
}

function OffsetLine({ label, before, after, text }: { label: string; before: number | null; after: number | null; text: (v: number | null) => string }) {
  const { colors } = useTheme();
  const factor = improvementFactor(before, after);
  return (
    <Text variant="small" style={{ color: colors.text }}>
      {label}: {text(before)} → {text(after)}
      {factor ? `  (${factor === 'exact' ? 'exact' : `${factor} smaller`})` : ''}
    </Text>
  );
}

// ---------------------------------------------------------------- warnings

const SEVERITY_LABEL = { problem: 'Problem', caution: 'Check', info: 'Note' } as const;

export function WarningsPanel({ warnings }: { warnings: ImplementationWarning[] }) {
  const { colors, radius, space, font } = useTheme();
  const tone = { problem: colors.danger, caution: colors.warning, info: colors.primary } as const;
  const order = { problem: 0, caution: 1, info: 2 } as const;
  const sorted = [...warnings].sort((a, b) => order[a.severity] - order[b.severity]);
  return (
    <Card testID="impl-warnings">
      <PanelTitle title="Findings" hint={warnings.length === 0 ? 'Nothing to report: no overflow risk, limit cycle or drift beyond the tolerances.' : undefined} />
      {sorted.map((w, i) => (
        <View key={`${w.code}-${i}`} testID={`impl-warning-${w.code}`} style={{ flexDirection: 'row', gap: space.md, alignItems: 'flex-start' }}>
          <View style={{ borderWidth: 1, borderColor: tone[w.severity], borderRadius: radius.sm, paddingHorizontal: 6, paddingVertical: 1, minWidth: 64, alignItems: 'center' }}>
            <Text variant="label" style={{ color: tone[w.severity], fontSize: 12 }}>
              {SEVERITY_LABEL[w.severity]}
            </Text>
          </View>
          <View style={{ flex: 1, gap: 2 }}>
            <Text variant="small" style={{ color: colors.text }}>
              {w.message}
            </Text>
            <Text variant="small" style={{ fontFamily: font.mono, fontSize: 11.5 }}>
              {w.code}
            </Text>
          </View>
        </View>
      ))}
    </Card>
  );
}
