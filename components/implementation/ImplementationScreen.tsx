import { Link, useLocalSearchParams, useRouter } from 'expo-router';
import { useMemo, useState } from 'react';
import { ActivityIndicator, View } from 'react-native';
import type { DesignSpec } from '../../schemas/design';
import type { Structure, WordLength } from '../../schemas/implementation';
import { isApiRequestError } from '../data/api';
import { useCurrentWorkspace } from '../data/session';
import { METHOD_LABELS } from '../design/methods';
import { useDesign, useDesignVersion, useSaveSpec } from '../design/queries';
import { statusLabel } from '../design/VersionList';
import { useLayoutWidth } from '../plots/useLayoutWidth';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Screen } from '../ui/Screen';
import { Text } from '../ui/Text';
import { BundlePanel } from './BundlePanel';
import { CodeView } from './CodeView';
import { AdvicePanel, CoefficientsPanel, PanelTitle, RootsPanel, WarningsPanel } from './PreviewPanels';
import { bundleZipUrl, useBundle, useBundleFiles, useGenerateBundle, useImplementPreview } from './queries';
import {
  buildSettings,
  defaultForm,
  errorsFromPaths,
  formFromSettings,
  fromWordLength,
  implementRequestFor,
  sameSettings,
  savedSettings,
  specWithSettings,
  withWordLength,
  type SettingsErrors,
  type SettingsForm,
} from './settings-form';
import { SettingsFields } from './SettingsFields';

/** Width of the settings column when the preview sits beside it. */
const FORM_COLUMN = 440;
const TWO_COLUMNS_FROM = 1040;

const canWrite = (role: string) => role === 'owner' || role === 'engineer';

const asInt = (v: string | string[] | undefined): number | null => {
  const s = Array.isArray(v) ? v[0] : v;
  return s !== undefined && /^\d+$/.test(s) ? Number(s) : null;
};

/** /implement/:designId, and /implement/:designId?version=N for a given saved version. */
export function ImplementationRouteScreen() {
  const params = useLocalSearchParams<{ designId: string; version?: string }>();
  const designId = asInt(params.designId) ?? -1;
  const version = asInt(params.version);
  return <ImplementationScreen designId={designId} versionNumber={version} />;
}

interface Props {
  designId: number;
  /** null: the latest version */
  versionNumber: number | null;
}

/** Fixed-point settings of a saved design version, the live preview, and its code bundle. */
export function ImplementationScreen({ designId, versionNumber }: Props) {
  const { workspace, role } = useCurrentWorkspace();
  const detail = useDesign(workspace.id, designId);
  const latestNumber = detail.data?.latest.number ?? null;
  const wantsOlder = versionNumber !== null && latestNumber !== null && versionNumber !== latestNumber;
  const older = useDesignVersion(workspace.id, designId, wantsOlder ? versionNumber : null);
  const [saveNote, setSaveNote] = useState<string | null>(null);

  if (detail.isPending || (wantsOlder && older.isPending)) {
    return (
      <Screen title="Implementation" testID="impl-screen">
        <ActivityIndicator />
      </Screen>
    );
  }
  const loadError = detail.error ?? (wantsOlder ? older.error : null);
  const d = detail.data;
  const spec: DesignSpec | undefined = wantsOlder ? older.data?.spec : d?.latest.spec;
  if (loadError || !d || !spec) {
    return (
      <Screen title="Implementation" testID="impl-screen">
        <Card tone="danger" testID="impl-load-error">
          <Text tone="danger">{loadError?.message ?? 'This design could not be read.'}</Text>
          <Link href="/designs">
            <Text tone="primary">Back to the designs</Text>
          </Link>
        </Card>
      </Screen>
    );
  }
  const shown = wantsOlder ? versionNumber! : d.latest.number;
  const status = wantsOlder ? older.data?.status : d.latest.status;
  return (
    <Workbench
      key={`${designId}-${shown}`}
      designId={designId}
      designName={d.design.name}
      versionNumber={shown}
      latestNumber={d.latest.number}
      statusText={status ? statusLabel(status) : ''}
      spec={spec}
      writable={canWrite(role)}
      saveNote={saveNote}
      onSaveNote={setSaveNote}
    />
  );
}

interface WorkbenchProps {
  designId: number;
  designName: string;
  versionNumber: number;
  latestNumber: number;
  statusText: string;
  spec: DesignSpec;
  /** the role may save settings and generate bundles */
  writable: boolean;
  saveNote: string | null;
  onSaveNote(note: string | null): void;
}

function Workbench({ designId, designName, versionNumber, latestNumber, statusText, spec, writable, saveNote, onSaveNote }: WorkbenchProps) {
  const { colors, space } = useTheme();
  const router = useRouter();
  const { workspace } = useCurrentWorkspace();
  const isLatest = versionNumber === latestNumber;
  const editable = writable && isLatest;
  const saved = useMemo(() => savedSettings(spec), [spec]);
  const unreadable = spec.implementation !== undefined && spec.implementation !== null && saved === null;
  const [form, setForm] = useState<SettingsForm>(() => (saved ? formFromSettings(saved) : defaultForm(designName)));
  const change = (next: SettingsForm) => {
    onSaveNote(null);
    setForm(next);
  };

  const built = useMemo(() => buildSettings(form), [form]);
  const body = useMemo(() => (built.settings ? implementRequestFor(spec, built.settings) : null), [built, spec]);
  const preview = useImplementPreview(body);
  const refused = preview.error && isApiRequestError(preview.error, 400) ? preview.error : null;
  const serverErrors = refused ? errorsFromPaths(refused.issues) : {};
  const { general: serverGeneral, ...serverFieldErrors } = serverErrors;
  const errors: SettingsErrors = { ...serverFieldErrors, ...built.errors };
  const dirty = !sameSettings(built.settings, saved);

  const save = useSaveSpec(workspace.id, designId);
  const saveIssues = save.error && isApiRequestError(save.error) ? errorsFromPaths(save.error.issues) : null;
  const onSave = () => {
    if (!built.settings) {
      onSaveNote('Correct the marked fields first.');
      return;
    }
    save.mutate(specWithSettings(spec, built.settings), {
      onSuccess: (r) => {
        if (r.created) {
          onSaveNote(`Saved as version ${r.version.number} (${statusLabel(r.version.status)}). Generate its bundle below.`);
          router.replace({ pathname: '/implement/[designId]', params: { designId: String(designId), version: String(r.version.number) } });
        } else {
          onSaveNote(`No change since version ${r.version.number}; nothing new was saved.`);
        }
      },
    });
  };

  const bundle = useBundle(workspace.id, designId, versionNumber);
  const generate = useGenerateBundle(workspace.id, designId);
  const stored = bundle.data ?? null;
  const storedFiles = useBundleFiles(workspace.id, designId, versionNumber, !!stored && !dirty);
  const blockedBy = !saved
    ? `Version ${versionNumber} has no implementation settings yet: save them first.`
    : dirty
      ? `The settings above differ from version ${versionNumber}: save them first (a new version), or put them back.`
      : null;
  const generateError = generate.error ? (isApiRequestError(generate.error) && generate.error.issues.length ? `${generate.error.message} ${generate.error.issues.map((i) => i.message).join(' ')}` : generate.error.message) : null;

  const useChoice = (c: { wordLength: WordLength; structure: Structure }) => {
    const next = withWordLength(form, fromWordLength(c.wordLength));
    change({ ...next, structure: c.structure });
  };

  const { width, onLayout } = useLayoutWidth();
  const twoColumns = width >= TWO_COLUMNS_FROM;
  const analysis = preview.data?.analysis;
  const stale = preview.isPlaceholderData || preview.isFetching || !!preview.error || !body;

  const showStored = !!stored && !dirty && !!storedFiles.data;
  const files = showStored ? storedFiles.data! : preview.data?.files ?? [];
  const filesSource = showStored
    ? `The files of the stored bundle of version ${versionNumber}, byte for byte.`
    : 'Preview of the files these settings give (not stored; the version number in them is filled in when the bundle is generated).';

  const settingsCard = (
    <Card testID="impl-settings">
      <PanelTitle title="Fixed-point settings" hint="Scaling in real units per count; the C works on raw counts." />
      {!isLatest ? (
        <Card tone="notice" testID="impl-older-version">
          <Text variant="bodyMedium">Version {versionNumber}, read-only</Text>
          <Text variant="small">Saved versions never change. Settings are edited on the latest version ({latestNumber}).</Text>
          <Link href={{ pathname: '/implement/[designId]', params: { designId: String(designId) } }}>
            <Text tone="primary">Open the latest version</Text>
          </Link>
        </Card>
      ) : null}
      {!writable ? (
        <Card tone="muted" testID="impl-read-only">
          <Text variant="small">Your role reads the implementation and downloads its bundle; engineers and owners change the settings and generate bundles.</Text>
        </Card>
      ) : null}
      {unreadable ? (
        <Text variant="small" tone="warning" testID="impl-unreadable">
          The settings saved in version {versionNumber} could not be read; the form starts from defaults.
        </Text>
      ) : null}
      {!saved && !unreadable ? (
        <Text variant="small" testID="impl-no-settings">
          Version {versionNumber} has no implementation settings yet; the form starts from defaults.
        </Text>
      ) : null}
      <SettingsFields form={form} onChange={change} errors={errors} readOnly={!editable} />
      {editable ? (
        <View style={{ gap: space.sm }}>
          <Button testID="impl-save" label="Save settings" onPress={onSave} busy={save.isPending} disabled={!dirty && !!saved} style={{ alignSelf: 'flex-start' }} />
          <Text variant="small">
            {dirty ? `Saving makes a new version of the design with these settings (now version ${versionNumber}).` : `These are the settings of version ${versionNumber}.`}
          </Text>
        </View>
      ) : null}
      {saveNote ? (
        <Text variant="small" testID="impl-save-note" style={{ color: colors.text }}>
          {saveNote}
        </Text>
      ) : null}
      {save.error ? (
        <Text variant="small" tone="danger" testID="impl-save-error">
          {save.error.message}
          {saveIssues ? ` ${Object.entries(saveIssues).filter(([k]) => k !== 'general').map(([, v]) => v).concat(saveIssues.general ?? []).join(' ')}` : ''}
        </Text>
      ) : null}
    </Card>
  );

  const bundleCard = (
    <BundlePanel
      versionNumber={versionNumber}
      bundle={stored}
      loading={bundle.isPending}
      loadError={bundle.error ? bundle.error.message : null}
      downloadUrl={bundleZipUrl(workspace.id, designId, versionNumber)}
      generate={writable ? { onPress: () => generate.mutate(versionNumber), busy: generate.isPending, blockedBy, error: generateError } : null}
    />
  );

  const previewColumn = (
    <View style={{ gap: space.lg }}>
      {!body && !analysis ? (
        <Card tone="muted" testID="impl-preview-empty">
          <Text variant="bodyMedium">The preview appears here</Text>
          <Text variant="small">Correct the marked fields; coefficients, quantized poles and the generated files follow as you type.</Text>
        </Card>
      ) : null}
      {preview.error && !refused ? (
        <Card tone="danger" testID="impl-preview-error">
          <Text tone="danger">{preview.error.message}</Text>
        </Card>
      ) : null}
      {refused ? (
        <Card tone="danger" testID="impl-preview-refused">
          <Text variant="bodyMedium" tone="danger">{refused.message}</Text>
          {(serverGeneral ?? []).map((m) => (
            <Text key={m} variant="small" style={{ color: colors.text }}>
              {m}
            </Text>
          ))}
        </Card>
      ) : null}
      {preview.isFetching ? (
        <Text variant="small" testID="impl-preview-busy">
          Computing…
        </Text>
      ) : null}
      {analysis ? (
        <View style={{ gap: space.lg, opacity: stale ? 0.6 : 1 }}>
          <AdvicePanel analysis={analysis} onUse={editable ? useChoice : undefined} />
          <WarningsPanel warnings={analysis.warnings} />
          <CoefficientsPanel analysis={analysis} />
          <RootsPanel analysis={analysis} />
        </View>
      ) : null}
      {files.length > 0 ? (
        <Card>
          <PanelTitle title="Generated files" />
          <CodeView key={showStored ? 'stored' : 'preview'} files={files} source={filesSource} stale={!showStored && stale} />
        </Card>
      ) : null}
    </View>
  );

  const subtitle = `Version ${versionNumber}${isLatest ? ' (latest)' : ''}${statusText ? ` · ${statusText}` : ''} · ${METHOD_LABELS[spec.method]} at ${spec.sampleRateHz} Hz`;
  return (
    <Screen
      title={designName}
      subtitle={subtitle}
      maxWidth={1480}
      testID="impl-screen"
      actions={
        <Link href={{ pathname: '/designs/[designId]', params: isLatest ? { designId: String(designId) } : { designId: String(designId), version: String(versionNumber) } }} testID="impl-open-design">
          <Text tone="primary" variant="bodyMedium">Open the design</Text>
        </Link>
      }
    >
      <View onLayout={onLayout} style={{ flexDirection: twoColumns ? 'row' : 'column', gap: space.xl, alignItems: 'flex-start' }}>
        <View style={{ width: twoColumns ? FORM_COLUMN : '100%', gap: space.lg }}>
          {settingsCard}
          {bundleCard}
        </View>
        <View style={{ flex: twoColumns ? 1 : undefined, width: twoColumns ? undefined : '100%', minWidth: 0 }}>{previewColumn}</View>
      </View>
    </Screen>
  );
}
