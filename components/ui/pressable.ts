import type { PressableStateCallbackType } from 'react-native';

/** react-native-web adds `hovered` to Pressable's state; native never does. */
export function isHovered(state: PressableStateCallbackType): boolean {
  return 'hovered' in state && (state as { hovered?: unknown }).hovered === true;
}
