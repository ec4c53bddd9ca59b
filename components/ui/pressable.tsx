import { forwardRef, useState } from 'react';
import { Pressable, View, type PressableProps, type PressableStateCallbackType, type StyleProp, type ViewStyle } from 'react-native';

/** react-native-web adds `hovered` to Pressable's state; native never does. */
export function isHovered(state: PressableStateCallbackType): boolean {
  return 'hovered' in state && (state as { hovered?: unknown }).hovered === true;
}

export interface LinkPressableProps extends Omit<PressableProps, 'style'> {
  /** the style for the hover state (a function `style` is lost inside <Link asChild>) */
  styleFor(state: { hovered: boolean }): StyleProp<ViewStyle>;
}

/**
 * The child of `<Link href asChild>` for a styled navigation target: Link's slot flattens
 * `style` and cannot call a style function, so hover is tracked here.
 */
export const LinkPressable = forwardRef<View, LinkPressableProps>(function LinkPressable(
  { styleFor, onHoverIn, onHoverOut, ...rest },
  ref,
) {
  const [hovered, setHovered] = useState(false);
  return (
    <Pressable
      ref={ref}
      {...rest}
      onHoverIn={(e) => {
        setHovered(true);
        onHoverIn?.(e);
      }}
      onHoverOut={(e) => {
        setHovered(false);
        onHoverOut?.(e);
      }}
      style={styleFor({ hovered })}
    />
  );
});
