import { Linking } from 'react-native';
import { Button } from '../ui/Button';

export interface DownloadLinkProps {
  url: string;
  fileName: string;
  label: string;
  testID?: string;
}

/** Native: hands the bundle address to the system (the web build uses a plain <a download>). */
export function DownloadLink({ url, label, testID }: DownloadLinkProps) {
  return <Button testID={testID} label={label} onPress={() => void Linking.openURL(url)} />;
}
