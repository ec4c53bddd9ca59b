import { forwardRef, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './Text';

export interface TextFieldProps extends Omit<TextInputProps, 'style'> {
  label: string;
  /** shown under the field in the danger colour; also marks the field invalid */
  error?: string;
  hint?: string;
  /** testID of the input; the error line gets `<testID>-error` */
  testID?: string;
}

export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField(
  { label, error, hint, testID, onFocus, onBlur, ...inputProps },
  ref,
) {
  const { colors, radius, space, font, size } = useTheme();
  const [focused, setFocused] = useState(false);
  const borderColor = error ? colors.danger : focused ? colors.primary : colors.border;
  return (
    <View style={{ gap: space.xs }}>
      <Text variant="label">{label}</Text>
      <TextInput
        ref={ref}
        testID={testID}
        accessibilityLabel={label}
        aria-invalid={error ? true : undefined}
        placeholderTextColor={colors.textMuted}
        onFocus={(e) => {
          setFocused(true);
          onFocus?.(e);
        }}
        onBlur={(e) => {
          setFocused(false);
          onBlur?.(e);
        }}
        style={[
          styles.input,
          {
            borderColor,
            borderRadius: radius.md,
            backgroundColor: colors.surface,
            color: colors.text,
            fontFamily: font.regular,
            fontSize: size.body,
            paddingHorizontal: space.md,
          },
          focused ? ({ outlineStyle: 'none', boxShadow: `0 0 0 3px ${colors.primary}22` } as object) : ({ outlineStyle: 'none' } as object),
        ]}
        {...inputProps}
      />
      {error ? (
        <Text variant="small" tone="danger" testID={testID ? `${testID}-error` : undefined} accessibilityRole="alert">
          {error}
        </Text>
      ) : hint ? (
        <Text variant="small">{hint}</Text>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  input: { borderWidth: 1, minHeight: 44 },
});
