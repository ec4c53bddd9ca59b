/** The one typed theme of the app. Read it through `useTheme()`; never hard-code colours. */
export const theme = {
  colors: {
    background: '#f6f5f1',
    surface: '#ffffff',
    surfaceAlt: '#eceae3',
    text: '#1d2327',
    textMuted: '#5b646b',
    border: '#d5d2c8',
    primary: '#1f5f8b',
    primaryText: '#ffffff',
    danger: '#b3261e',
    warning: '#8a5a00',
    success: '#2e6b3a',
    /** plot series: continuous reference, then one per discretization method */
    series: {
      continuous: '#1d2327',
      tustin: '#1f5f8b',
      prewarp: '#7a4eab',
      matched: '#c0622f',
      zoh: '#2e8b57',
      'backward-euler': '#a33b5c',
    },
  },
  space: { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 },
  radius: { sm: 4, md: 8, lg: 12 },
  font: {
    regular: 'Inter_400Regular',
    medium: 'Inter_500Medium',
    bold: 'Inter_700Bold',
    mono: 'JetBrainsMono_400Regular',
  },
  size: { small: 13, body: 15, title: 20, heading: 26 },
  /** at this window width and wider the shell shows a side navigation */
  wideBreakpoint: 1024,
} as const;

export type Theme = typeof theme;

export function useTheme(): Theme {
  return theme;
}
