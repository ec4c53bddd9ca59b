import { useCallback, useState } from 'react';
import type { LayoutChangeEvent } from 'react-native';

/** Width of a container measured with onLayout, so plots draw at their real size. */
export function useLayoutWidth(initialWidth = 0): { width: number; onLayout: (e: LayoutChangeEvent) => void } {
  const [width, setWidth] = useState(initialWidth);
  const onLayout = useCallback((e: LayoutChangeEvent) => {
    const next = Math.floor(e.nativeEvent.layout.width);
    setWidth((prev) => (Math.abs(prev - next) >= 1 ? next : prev));
  }, []);
  return { width, onLayout };
}
