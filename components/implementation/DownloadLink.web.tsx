import { useState } from 'react';
import { useTheme } from '../theme';
import type { DownloadLinkProps } from './DownloadLink';

/**
 * Web: a plain link to the zip with the download attribute, so the browser saves the file
 * itself (with the session cookie, and the name the server gives in Content-Disposition).
 */
export function DownloadLink({ url, fileName, label, testID }: DownloadLinkProps) {
  const { colors, radius, space, font } = useTheme();
  const [hover, setHover] = useState(false);
  return (
    <a
      href={url}
      download={fileName}
      data-testid={testID}
      onMouseEnter={() => setHover(true)}
      onMouseLeave={() => setHover(false)}
      style={{
        display: 'inline-flex',
        alignItems: 'center',
        justifyContent: 'center',
        alignSelf: 'flex-start',
        boxSizing: 'border-box',
        minHeight: 44,
        padding: `0 ${space.lg}px`,
        borderRadius: radius.md,
        border: `1px solid ${colors.primary}`,
        backgroundColor: colors.primary,
        color: colors.primaryText,
        fontFamily: font.medium,
        fontSize: 15,
        textDecoration: 'none',
        opacity: hover ? 0.9 : 1,
        maxWidth: '100%',
        overflow: 'hidden',
        textOverflow: 'ellipsis',
        whiteSpace: 'nowrap',
      }}
    >
      {label}
    </a>
  );
}
