import { Pressable, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './Text';

export interface SegmentedOption<T extends string> {
  value: T;
  label: string;
}

export interface SegmentedProps<T extends string> {
  options: readonly SegmentedOption<T>[];
  value: T;
  onChange(value: T): void;
  /** testID of the group; each option gets `<testID>-<value>` */
  testID?: string;
  accessibilityLabel: string;
  disabled?: boolean;
  compact?: boolean;
}

/** A row of mutually exclusive choices (a radio group). */
export function Segmented<T extends string>({ options, value, onChange, testID, accessibilityLabel, disabled, compact }: SegmentedProps<T>) {
  const { colors, radius, space } = useTheme();
  return (
    <View
      testID={testID}
      accessibilityRole="radiogroup"
      accessibilityLabel={accessibilityLabel}
      style={{
        flexDirection: 'row',
        borderWidth: 1,
        borderColor: colors.border,
        borderRadius: radius.md,
        backgroundColor: colors.surfaceAlt,
        padding: 2,
        alignSelf: 'flex-start',
        maxWidth: '100%',
        opacity: disabled ? 0.6 : 1,
      }}
    >
      {options.map((option) => {
        const selected = option.value === value;
        return (
          <Pressable
            key={option.value}
            testID={testID ? `${testID}-${option.value}` : undefined}
            accessibilityRole="radio"
            accessibilityState={{ checked: selected, disabled: !!disabled }}
            aria-checked={selected}
            disabled={disabled}
            onPress={() => onChange(option.value)}
            style={{
              paddingHorizontal: compact ? space.sm : space.md,
              minHeight: compact ? 30 : 36,
              justifyContent: 'center',
              borderRadius: radius.sm + 2,
              backgroundColor: selected ? colors.surface : 'transparent',
              ...(selected ? ({ boxShadow: '0 1px 2px rgba(29,35,39,0.18)' } as object) : {}),
            }}
          >
            <Text variant="label" style={{ color: selected ? colors.text : colors.textMuted, fontSize: compact ? 12.5 : 13 }}>
              {option.label}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}
