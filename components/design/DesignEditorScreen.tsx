import { Link, useRouter } from 'expo-router';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { ActivityIndicator, View } from 'react-native';
import type { DesignSpec } from '../../schemas/design';
import { isApiRequestError } from '../data/api';
import { useCurrentWorkspace } from '../data/session';
import { useLayoutWidth } from '../plots/useLayoutWidth';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Screen } from '../ui/Screen';
import { Segmented } from '../ui/Segmented';
import { Text } from '../ui/Text';
import { TextField } from '../ui/TextField';
import { AnalysisPanel } from './AnalysisPanel';
import { Cautions } from './Cautions';
import { CompensatorEntry, PlantEntry } from './CompensatorEntry';
import { buildCompensator, formatNumber, type FieldErrors } from './entry';
import { PolePlacementPanel } from './PolePlacementPanel';
import { useCreateDesign, useDesign, useDesignVersion, useDiscretize, useSaveSpec, useUpdateDesign } from './queries';
import { DelayField, SamplingFields, ToleranceFields } from './SamplingFields';
import { buildSpec, discretizeRequestFor, editorStateFromSpec, errorsFromIssues, newEditorState, type EditorState } from './spec';
import { VersionList, statusLabel } from './VersionList';

/** Width of the form column when the analysis sits beside it. */
const FORM_COLUMN = 420;
const TWO_COLUMNS_FROM = 1000;

const canWrite = (role: string) => role === 'owner' || role === 'engineer';

/** Errors under one prefix ("compensator.", "plant."), without it. */
function under(errors: FieldErrors, prefix: string): FieldErrors {
  const out: FieldErrors = {};
  for (const [k, v] of Object.entries(errors)) if (k.startsWith(prefix)) out[k.slice(prefix.length)] = v;
  return out;
}

interface Props {
  /** null: a new design */
  designId: number | null;
  /** show this saved version, read-only */
  versionNumber?: number | null;
}

/** The design editor: entry on one side, live analysis on the other; save makes a new draft version. */
export function DesignEditorScreen({ designId, versionNumber = null }: Props) {
  const { workspace, role } = useCurrentWorkspace();
  const detail = useDesign(workspace.id, designId);
  const version = useDesignVersion(workspace.id, designId ?? -1, designId === null ? null : versionNumber);
  const readOnly = versionNumber !== null || !canWrite(role);

  const source: DesignSpec | undefined = versionNumber !== null ? version.data?.spec : detail.data?.latest.spec;
  // the latest view keeps its fields across saves; another version is another editor
  const sourceKey = versionNumber !== null ? `v${versionNumber}` : 'latest';

  if (designId !== null && (detail.isPending || (versionNumber !== null && version.isPending))) {
    return (
      <Screen title="Design" testID="design-editor">
        <ActivityIndicator />
      </Screen>
    );
  }
  const loadError = detail.error ?? version.error;
  if (designId !== null && (loadError || !source)) {
    return (
      <Screen title="Design" testID="design-editor">
        <Card tone="danger">
          <Text tone="danger">{loadError?.message ?? 'This design could not be read.'}</Text>
          <Link href="/designs">
            <Text tone="primary">Back to the designs</Text>
          </Link>
        </Card>
      </Screen>
    );
  }
  return (
    <Editor
      key={`${designId ?? 'new'}-${sourceKey}`}
      designId={designId}
      initial={source}
      readOnly={readOnly}
      canWrite={canWrite(role)}
      versionNumber={versionNumber}
    />
  );
}

function Editor({ designId, initial, readOnly, canWrite: writable, versionNumber }: { designId: number | null; initial?: DesignSpec; readOnly: boolean; canWrite: boolean; versionNumber: number | null }) {
  const { colors, space } = useTheme();
  const router = useRouter();
  const { workspace } = useCurrentWorkspace();
  const detail = useDesign(workspace.id, designId);
  const [state, setState] = useState<EditorState>(() => (initial ? editorStateFromSpec(initial) : newEditorState()));
  const [name, setName] = useState('');
  const [saveNote, setSaveNote] = useState<string | null>(null);
  const patch = (p: Partial<EditorState>) => {
    setSaveNote(null);
    setState((s) => ({ ...s, ...p }));
  };

  const built = useMemo(() => buildSpec(state, { implementation: initial?.implementation }), [state, initial]);
  const request = useMemo(() => (built.spec ? discretizeRequestFor(built.spec) : null), [built]);
  const analysis = useDiscretize(request?.body ?? null);
  const server = analysis.error && isApiRequestError(analysis.error, 400) ? errorsFromIssues(state, analysis.error.issues) : { errors: {}, general: [] as string[] };
  const errors: FieldErrors = { ...server.errors, ...built.errors };
  const placementPlant = useMemo(() => (state.plantOn ? buildCompensator(state.plant).compensator ?? null : null), [state.plantOn, state.plant]);

  const create = useCreateDesign(workspace.id);
  const save = useSaveSpec(workspace.id, designId ?? -1);
  const saveError = create.error ?? save.error;
  const saveIssues = saveError && isApiRequestError(saveError) ? errorsFromIssues(state, saveError.issues) : null;
  const [nameError, setNameError] = useState<string | undefined>();

  const onSave = () => {
    if (!built.spec) {
      setSaveNote('Correct the marked fields first.');
      return;
    }
    if (designId === null) {
      if (name.trim() === '') {
        setNameError('Enter a name');
        return;
      }
      create.mutate(
        { name: name.trim(), spec: built.spec },
        { onSuccess: (d) => router.replace({ pathname: '/designs/[designId]', params: { designId: String(d.design.id) } }) },
      );
    } else {
      save.mutate(built.spec, {
        onSuccess: (r) => setSaveNote(r.created ? `Saved as version ${r.version.number} (${statusLabel(r.version.status)}).` : `No change since version ${r.version.number}; nothing new was saved.`),
      });
    }
  };

  const { width, onLayout } = useLayoutWidth();
  const twoColumns = width >= TWO_COLUMNS_FROM;
  const d = detail.data;
  const title = designId === null ? 'New design' : d?.design.name ?? 'Design';
  const latest = d?.latest;
  const analysisStale = analysis.isPlaceholderData || analysis.isFetching || !!analysis.error || !request;

  const form = (
    <View style={{ gap: space.lg }}>
      {versionNumber !== null && (
        <Card tone="notice" testID="read-only-banner">
          <Text variant="bodyMedium">Version {versionNumber}, read-only</Text>
          <Text variant="small">Saved versions never change. Open the latest to edit.</Text>
          <Link href={{ pathname: '/designs/[designId]', params: { designId: String(designId) } }}>
            <Text tone="primary">Open the latest version</Text>
          </Link>
        </Card>
      )}
      {designId !== null && !writable && versionNumber === null && (
        <Card tone="muted">
          <Text variant="small">Your role here reads designs; engineers and owners change them.</Text>
        </Card>
      )}
      <Section title="Compensator" hint="Continuous-time, roots in rad/s.">
        <CompensatorEntry fields={state.entry} onChange={(entry) => patch({ entry })} errors={under(errors, 'compensator.')} readOnly={readOnly} parsed={analysis.data?.continuous} />
        {state.entry.form === 'lead' && !readOnly && (
          <PolePlacementPanel
            plant={placementPlant}
            plantOn={state.plantOn}
            onAskPlant={() => patch({ plantOn: true })}
            onUseLead={(l) => patch({ entry: { form: 'lead', gain: formatNumber(l.gain), zero: formatNumber(l.zero), pole: formatNumber(l.pole) } })}
          />
        )}
      </Section>
      <Section title="Sampling">
        <SamplingFields state={state} onChange={patch} errors={errors} readOnly={readOnly} defaults={analysis.data ? { prewarpHz: analysis.data.prewarpHz, bandHz: analysis.data.bandHz } : undefined} />
      </Section>
      <Section title="Plant" hint="Optional. With a plant the loop is analysed: ZOH plant, negative unity feedback.">
        <Segmented
          testID="plant-on"
          accessibilityLabel="Plant"
          options={[
            { value: 'off', label: 'No plant' },
            { value: 'on', label: 'With plant' },
          ]}
          value={state.plantOn ? 'on' : 'off'}
          onChange={(v) => patch({ plantOn: v === 'on' })}
          disabled={readOnly}
          compact
        />
        {state.plantOn && (
          <>
            <PlantEntry fields={state.plant} onChange={(plant) => patch({ plant })} errors={under(errors, 'plant.')} readOnly={readOnly} />
            <DelayField value={state.delaySamples} onChange={(delaySamples) => patch({ delaySamples })} readOnly={readOnly} />
          </>
        )}
      </Section>
      <Section title="Tolerances" hint="What a reviewer accepts; figures beyond them are marked red.">
        <ToleranceFields state={state} onChange={patch} errors={errors} readOnly={readOnly} />
      </Section>
      {server.general.map((m) => (
        <Text key={m} tone="danger" variant="small">
          {m}
        </Text>
      ))}
      {!readOnly && (
        <Card testID="save-card">
          <Text variant="title">Save</Text>
          {designId === null ? (
            <TextField testID="design-name" label="Design name" placeholder="e.g. Gimbal pitch lead, 2 kHz" value={name} onChangeText={(t) => { setName(t); setNameError(undefined); }} error={nameError ?? saveIssues?.errors.name} maxLength={120} />
          ) : latest ? (
            <Text testID="design-version" variant="bodyMedium">
              Latest: version {latest.number} · {statusLabel(latest.status)}
            </Text>
          ) : null}
          <Button testID="design-save" label={designId === null ? 'Create design' : 'Save as new version'} onPress={onSave} busy={create.isPending || save.isPending} />
          {saveNote ? (
            <Text variant="small" testID="save-note" style={{ color: colors.text }}>
              {saveNote}
            </Text>
          ) : null}
          {saveError ? (
            <Text variant="small" tone="danger" testID="save-error">
              {saveError.message}
              {saveIssues ? ` ${Object.values(saveIssues.errors).concat(saveIssues.general).join(' ')}` : ''}
            </Text>
          ) : null}
          <Cautions />
        </Card>
      )}
      {d && (
        <Card testID="implement-card">
          <Text variant="title">Fixed point and C code</Text>
          <Text variant="small" tone="textMuted">
            Word length, scaling and output limits for version {versionNumber ?? d.latest.number}, the quantized coefficients, and the code bundle with its test vectors.
          </Text>
          <Button
            testID="design-implement"
            kind="secondary"
            label="Open the implementation"
            onPress={() => router.push({ pathname: '/implement/[designId]', params: { designId: String(d.design.id), version: String(versionNumber ?? d.latest.number) } })}
          />
        </Card>
      )}
      {d && <VersionList designId={d.design.id} versions={d.versions} current={versionNumber ?? d.latest.number} />}
    </View>
  );

  const analysisView = (
    <View style={{ gap: space.md }}>
      {!request && !analysis.data && (
        <Card tone="muted" testID="analysis-empty">
          <Text variant="bodyMedium">The analysis appears here</Text>
          <Text variant="small">Enter the compensator and the sample rate; the plots and the drift table follow as you type.</Text>
        </Card>
      )}
      {analysis.error && !isApiRequestError(analysis.error, 400) && (
        <Card tone="danger">
          <Text tone="danger">{analysis.error.message}</Text>
        </Card>
      )}
      {analysis.error && isApiRequestError(analysis.error, 400) && (
        <Card tone="danger" testID="analysis-refused">
          <Text variant="bodyMedium" tone="danger">{analysis.error.message}</Text>
          {analysis.error.issues.map((i) => (
            <Text key={i.path + i.message} variant="small" style={{ color: colors.text }}>
              {i.path}: {i.message}
            </Text>
          ))}
        </Card>
      )}
      {analysis.isFetching && <Text variant="small">Computing…</Text>}
      {analysis.data && built.spec ? (
        <AnalysisPanel answer={analysis.data} chosen={state.method} tolerances={built.spec.tolerances} skipped={request?.skipped ?? []} stale={analysisStale} />
      ) : analysis.data && initial ? (
        <AnalysisPanel answer={analysis.data} chosen={state.method} tolerances={initial.tolerances} skipped={[]} stale />
      ) : null}
    </View>
  );

  return (
    <Screen title={title} subtitle={designId === null ? 'Enter a compensator, compare the discretizations, then save the first version.' : workspace.name} maxWidth={1480} testID="design-editor" actions={designId !== null && d && writable ? <RenameButton designId={designId} name={d.design.name} /> : undefined}>
      <View onLayout={onLayout} style={{ flexDirection: twoColumns ? 'row' : 'column', gap: space.xl, alignItems: 'flex-start' }}>
        <View style={{ width: twoColumns ? FORM_COLUMN : '100%' }}>{form}</View>
        <View style={{ flex: twoColumns ? 1 : undefined, width: twoColumns ? undefined : '100%', minWidth: 0 }}>{analysisView}</View>
      </View>
    </Screen>
  );
}

function Section({ title, hint, children }: { title: string; hint?: string; children: ReactNode }) {
  return (
    <Card>
      <View style={{ gap: 2 }}>
        <Text variant="title">{title}</Text>
        {hint ? <Text variant="small">{hint}</Text> : null}
      </View>
      {children}
    </Card>
  );
}

function RenameButton({ designId, name }: { designId: number; name: string }) {
  const { space } = useTheme();
  const { workspace } = useCurrentWorkspace();
  const update = useUpdateDesign(workspace.id);
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState(name);
  useEffect(() => setText(name), [name]);
  if (!editing) return <Button testID="design-rename" label="Rename" kind="secondary" compact onPress={() => setEditing(true)} />;
  return (
    <View style={{ flexDirection: 'row', gap: space.sm, alignItems: 'flex-end', flexWrap: 'wrap' }}>
      <View style={{ minWidth: 220 }}>
        <TextField testID="design-rename-input" label="New name" value={text} onChangeText={setText} maxLength={120} error={update.error?.message} />
      </View>
      <Button
        testID="design-rename-save"
        label="Save name"
        compact
        busy={update.isPending}
        onPress={() => update.mutate({ designId, name: text.trim() }, { onSuccess: () => setEditing(false) })}
        disabled={text.trim() === ''}
      />
      <Button label="Cancel" kind="quiet" compact onPress={() => setEditing(false)} />
    </View>
  );
}
