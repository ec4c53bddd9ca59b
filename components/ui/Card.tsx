import { View, type StyleProp, type ViewProps, type ViewStyle } from 'react-native';
import { useTheme } from '../theme';

export interface CardProps extends ViewProps {
  style?: StyleProp<ViewStyle>;
  /** a tinted, borderless variant for notes and summaries */
  tone?: 'plain' | 'muted' | 'notice' | 'danger';
}

export function Card({ style, tone = 'plain', ...rest }: CardProps) {
  const { colors, radius, space } = useTheme();
  const tones: Record<NonNullable<CardProps['tone']>, ViewStyle> = {
    plain: { backgroundColor: colors.surface, borderColor: colors.border },
    muted: { backgroundColor: colors.surfaceAlt, borderColor: colors.surfaceAlt },
    notice: { backgroundColor: '#fff8e6', borderColor: '#e8d29a' },
    danger: { backgroundColor: '#fcefee', borderColor: '#ebc2bf' },
  };
  return (
    <View
      {...rest}
      style={[{ borderWidth: 1, borderRadius: radius.lg, padding: space.lg, gap: space.md }, tones[tone], style]}
    />
  );
}
