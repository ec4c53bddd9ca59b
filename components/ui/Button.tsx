import { ActivityIndicator, Pressable, StyleSheet, View, type StyleProp, type ViewStyle } from 'react-native';
import { isHovered } from './pressable';
import { useTheme } from '../theme';
import { Text } from './Text';

export type ButtonKind = 'primary' | 'secondary' | 'danger' | 'quiet';

export interface ButtonProps {
  label: string;
  onPress?: () => void;
  kind?: ButtonKind;
  disabled?: boolean;
  busy?: boolean;
  testID?: string;
  accessibilityLabel?: string;
  compact?: boolean;
  style?: StyleProp<ViewStyle>;
}

export function Button({ label, onPress, kind = 'primary', disabled, busy, testID, accessibilityLabel, compact, style }: ButtonProps) {
  const { colors, radius, space } = useTheme();
  const inactive = disabled || busy;
  const palette = {
    primary: { bg: colors.primary, fg: colors.primaryText, border: colors.primary },
    secondary: { bg: colors.surface, fg: colors.text, border: colors.border },
    danger: { bg: colors.danger, fg: colors.primaryText, border: colors.danger },
    quiet: { bg: 'transparent', fg: colors.primary, border: 'transparent' },
  }[kind];
  return (
    <Pressable
      testID={testID}
      accessibilityRole="button"
      accessibilityLabel={accessibilityLabel ?? label}
      accessibilityState={{ disabled: !!inactive, busy: !!busy }}
      disabled={inactive}
      onPress={onPress}
      style={(state) => {
        const { pressed } = state;
        const hovered = isHovered(state);
        return [
        styles.base,
        {
          backgroundColor: palette.bg,
          borderColor: palette.border,
          borderRadius: radius.md,
          paddingHorizontal: compact ? space.md : space.lg,
          minHeight: compact ? 34 : 44,
          opacity: inactive ? 0.55 : pressed ? 0.85 : 1,
        },
        hovered && !inactive && kind !== 'primary' && kind !== 'danger' ? { backgroundColor: colors.surfaceAlt } : null,
        style,
      ];
        }}
    >
      <View style={styles.row}>
        {busy ? <ActivityIndicator size="small" color={palette.fg} style={{ marginRight: space.sm }} /> : null}
        <Text variant="bodyMedium" style={{ color: palette.fg, fontSize: compact ? 14 : 15 }}>
          {label}
        </Text>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: { borderWidth: 1, alignItems: 'center', justifyContent: 'center' },
  row: { flexDirection: 'row', alignItems: 'center' },
});
