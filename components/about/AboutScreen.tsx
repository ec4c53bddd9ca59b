import { View } from 'react-native';
import { useTheme } from '../theme';
import { Card } from '../ui/Card';
import { Screen } from '../ui/Screen';
import { Text } from '../ui/Text';
import { PasswordCard } from '../account/PasswordCard';

/** The full cautions of DESIGN.md, reachable from every signed-in screen. */
export const CAUTIONS = [
  'Generated controllers drive real actuators. Verify every controller on the target with current and travel limits in place before it moves anything.',
  'The generated code is not certified for safety-related use.',
  'Follow the functional-safety standard, the local codes and the licensed engineering practice that apply to your machine.',
] as const;

export function AboutScreen() {
  const { space } = useTheme();
  return (
    <Screen testID="about-screen" title="Account and cautions" subtitle="Samplewright 0.1">
      <Card tone="notice" testID="cautions">
        <Text variant="title">Before a controller leaves the bench</Text>
        <View style={{ gap: space.sm }}>
          {CAUTIONS.map((line) => (
            <View key={line} style={{ flexDirection: 'row', gap: space.sm }}>
              <Text>•</Text>
              <Text style={{ flex: 1 }}>{line}</Text>
            </View>
          ))}
        </View>
      </Card>
      <PasswordCard />
      <Card>
        <Text variant="title">What Samplewright does</Text>
        <Text>
          It turns a continuous-time compensator into a fixed-point C implementation for a microcontroller: it
          discretizes the design with the method you choose, shows how far poles, frequency response and loop margins
          moved, quantizes the coefficients for the word length you pick, and, once a reviewer approved the version,
          packs C source, test vectors and a manifest into a bundle that never changes.
        </Text>
        <Text variant="small">
          Typefaces: Inter and JetBrains Mono, both under the SIL Open Font License 1.1 (assets/fonts).
        </Text>
      </Card>
    </Screen>
  );
}
