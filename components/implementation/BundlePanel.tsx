import { View } from 'react-native';
import type { BundleInfo } from '../../schemas/implementation-api';
import { Cautions } from '../design/Cautions';
import { formatWhen } from '../design/VersionList';
import { useTheme } from '../theme';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { Text } from '../ui/Text';
import { sizeText } from './display';
import { DownloadLink } from './DownloadLink';
import { PanelTitle } from './PreviewPanels';

interface Props {
  versionNumber: number;
  bundle: BundleInfo | null | undefined;
  loading: boolean;
  loadError: string | null;
  downloadUrl: string;
  /** null: this role does not generate bundles */
  generate: null | {
    onPress(): void;
    busy: boolean;
    /** why it cannot be pressed now, if so */
    blockedBy: string | null;
    error: string | null;
  };
}

/** Generate the bundle of the saved version, then download it; its SHA-256 and the cautions beside it. */
export function BundlePanel({ versionNumber, bundle, loading, loadError, downloadUrl, generate }: Props) {
  const { colors, radius, space, font } = useTheme();
  return (
    <Card testID="impl-bundle">
      <PanelTitle title="Code bundle" hint={`C source, header, test program, test vectors and Makefile of version ${versionNumber}, as a zip whose bytes never change.`} />
      {loading ? <Text variant="small">Looking for a stored bundle…</Text> : null}
      {loadError ? <Text variant="small" tone="danger">{loadError}</Text> : null}
      {!loading && !bundle && !loadError ? (
        <Text variant="small" testID="impl-bundle-none" style={{ color: colors.text }}>
          No bundle has been generated for version {versionNumber} yet.
          {generate ? '' : ' Engineers and owners generate bundles.'}
        </Text>
      ) : null}
      {generate && !bundle ? (
        <View style={{ gap: space.xs }}>
          <Button testID="impl-generate" label={`Generate bundle of version ${versionNumber}`} onPress={generate.onPress} busy={generate.busy} disabled={!!generate.blockedBy} style={{ alignSelf: 'flex-start' }} />
          {generate.blockedBy ? <Text variant="small" testID="impl-generate-blocked">{generate.blockedBy}</Text> : null}
          {generate.error ? <Text variant="small" tone="danger" testID="impl-generate-error">{generate.error}</Text> : null}
        </View>
      ) : null}
      {bundle ? (
        <View style={{ gap: space.md }}>
          <DownloadLink testID="impl-download" url={downloadUrl} fileName={bundle.fileName} label={`Download ${bundle.fileName}`} />
          <View style={{ gap: 4 }}>
            <Text variant="overline">SHA-256 of the zip</Text>
            <View style={{ backgroundColor: colors.surfaceAlt, borderRadius: radius.sm, paddingHorizontal: space.sm, paddingVertical: 6 }}>
              <Text testID="impl-sha256" selectable style={{ fontFamily: font.mono, fontSize: 12.5, lineHeight: 18, color: colors.text, ...BREAK_ANYWHERE }}>
                {bundle.sha256}
              </Text>
            </View>
            <Text variant="small" testID="impl-bundle-meta">
              {sizeText(bundle.sizeBytes)} · generator {bundle.generatorVersion} · made {formatWhen(bundle.createdAt)}
            </Text>
          </View>
          {generate ? (
            <Text variant="small">Generating again gives the same bytes; change the settings and save to get a new version.</Text>
          ) : null}
        </View>
      ) : null}
      <Cautions />
    </Card>
  );
}

/** Web: let the 64-character hash wrap on a phone. */
const BREAK_ANYWHERE = { wordBreak: 'break-all' } as object;
