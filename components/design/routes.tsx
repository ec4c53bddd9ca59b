import { useLocalSearchParams } from 'expo-router';
import { DesignEditorScreen } from './DesignEditorScreen';

/** /designs/new */
export function NewDesignScreen() {
  return <DesignEditorScreen designId={null} />;
}

const asInt = (v: string | string[] | undefined): number | null => {
  const s = Array.isArray(v) ? v[0] : v;
  return s !== undefined && /^\d+$/.test(s) ? Number(s) : null;
};

/** /designs/:designId, and /designs/:designId?version=N for an older version, read-only */
export function DesignRouteScreen() {
  const params = useLocalSearchParams<{ designId: string; version?: string }>();
  const designId = asInt(params.designId);
  const version = asInt(params.version);
  return <DesignEditorScreen key={`${designId}-${version ?? 'latest'}`} designId={designId ?? -1} versionNumber={version} />;
}
