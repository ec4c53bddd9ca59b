import { Text as RNText, type TextProps, type TextStyle } from 'react-native';
import { useTheme, type Theme } from '../theme';

export type TextVariant = 'heading' | 'title' | 'body' | 'bodyMedium' | 'label' | 'small' | 'mono' | 'overline';

function variantStyle(theme: Theme, variant: TextVariant): TextStyle {
  const { font, size, colors } = theme;
  switch (variant) {
    case 'heading':
      return { fontFamily: font.bold, fontSize: size.heading, lineHeight: 32, color: colors.text, letterSpacing: -0.3 };
    case 'title':
      return { fontFamily: font.bold, fontSize: size.title, lineHeight: 26, color: colors.text };
    case 'bodyMedium':
      return { fontFamily: font.medium, fontSize: size.body, lineHeight: 22, color: colors.text };
    case 'label':
      return { fontFamily: font.medium, fontSize: size.small, lineHeight: 18, color: colors.text };
    case 'small':
      return { fontFamily: font.regular, fontSize: size.small, lineHeight: 18, color: colors.textMuted };
    case 'mono':
      return { fontFamily: font.mono, fontSize: size.body, lineHeight: 22, color: colors.text };
    case 'overline':
      return { fontFamily: font.medium, fontSize: 11, lineHeight: 16, color: colors.textMuted, letterSpacing: 0.8, textTransform: 'uppercase' };
    case 'body':
    default:
      return { fontFamily: font.regular, fontSize: size.body, lineHeight: 22, color: colors.text };
  }
}

export interface AppTextProps extends TextProps {
  variant?: TextVariant;
  /** a theme colour name, e.g. "textMuted", "danger" */
  tone?: 'text' | 'textMuted' | 'primary' | 'danger' | 'warning' | 'success' | 'primaryText';
}

/** Text in the app's fonts. Weights are separate font families, so never set fontWeight. */
export function Text({ variant = 'body', tone, style, ...rest }: AppTextProps) {
  const theme = useTheme();
  return (
    <RNText
      {...rest}
      style={[variantStyle(theme, variant), tone ? { color: theme.colors[tone] } : null, style]}
    />
  );
}
