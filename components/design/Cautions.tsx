import { View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from '../ui/Text';

/** DESIGN.md "Cautions the product shows", in full, where a design is saved. */
export function Cautions() {
  const { colors, radius, space } = useTheme();
  return (
    <View testID="design-cautions" style={{ borderLeftWidth: 3, borderLeftColor: colors.warning, backgroundColor: '#fff8e6', borderRadius: radius.sm, padding: space.md, gap: space.xs }}>
      <Text variant="label" style={{ color: colors.warning }}>Before this drives hardware</Text>
      <Text variant="small" style={{ color: colors.text }}>
        Generated controllers drive real actuators. Verify on the target with current and travel limits in place. The code is not
        certified for safety-related use; follow the functional-safety standard and the local codes and licensed engineering practice
        that apply.
      </Text>
    </View>
  );
}
