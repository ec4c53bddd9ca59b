import Svg, { Circle, Path, Rect } from 'react-native-svg';

export interface IconProps {
  color: string;
  size?: number;
}

const stroke = { strokeWidth: 1.8, strokeLinecap: 'round' as const, strokeLinejoin: 'round' as const, fill: 'none' };

export function OverviewIcon({ color, size = 22 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24">
      <Rect x={3.5} y={3.5} width={7} height={7} rx={1.5} stroke={color} {...stroke} />
      <Rect x={13.5} y={3.5} width={7} height={7} rx={1.5} stroke={color} {...stroke} />
      <Rect x={3.5} y={13.5} width={7} height={7} rx={1.5} stroke={color} {...stroke} />
      <Rect x={13.5} y={13.5} width={7} height={7} rx={1.5} stroke={color} {...stroke} />
    </Svg>
  );
}

/** a staircase over a smooth curve: a sampled signal */
export function DesignsIcon({ color, size = 22 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24">
      <Path d="M3 18 C7 18 8 6 12 6 S17 14 21 14" stroke={color} {...stroke} />
      <Path d="M3 20 H6 V16 H9 V9 H12 V7 H15 V11 H18 V14 H21" stroke={color} {...stroke} strokeWidth={1.4} opacity={0.7} />
    </Svg>
  );
}

export function MembersIcon({ color, size = 22 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24">
      <Circle cx={9} cy={8.5} r={3.5} stroke={color} {...stroke} />
      <Path d="M2.5 20c.8-3.6 3.4-5.5 6.5-5.5s5.7 1.9 6.5 5.5" stroke={color} {...stroke} />
      <Path d="M15.5 5.3a3.3 3.3 0 0 1 0 6.4M18 14.8c1.8.8 3 2.6 3.5 5.2" stroke={color} {...stroke} />
    </Svg>
  );
}

export function InfoIcon({ color, size = 20 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24">
      <Circle cx={12} cy={12} r={9} stroke={color} {...stroke} />
      <Path d="M12 11v6M12 7.5v.01" stroke={color} {...stroke} strokeWidth={2.2} />
    </Svg>
  );
}

export function ChevronDownIcon({ color, size = 16 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24">
      <Path d="M6 9l6 6 6-6" stroke={color} {...stroke} strokeWidth={2.2} />
    </Svg>
  );
}

export function CheckIcon({ color, size = 18 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24">
      <Path d="M5 12.5l4.5 4.5L19 7.5" stroke={color} {...stroke} strokeWidth={2.2} />
    </Svg>
  );
}

/** the product mark: a sample-and-hold staircase in a rounded square */
export function MarkIcon({ size = 28, color, accent }: IconProps & { accent: string }) {
  return (
    <Svg width={size} height={size} viewBox="0 0 32 32">
      <Rect x={0} y={0} width={32} height={32} rx={8} fill={color} />
      <Path d="M6 23 H11 V17 H16 V11 H21 V8 H26" stroke={accent} strokeWidth={2.6} strokeLinecap="round" strokeLinejoin="round" fill="none" />
      <Circle cx={11} cy={17} r={1.8} fill={accent} />
      <Circle cx={16} cy={11} r={1.8} fill={accent} />
      <Circle cx={21} cy={8} r={1.8} fill={accent} />
    </Svg>
  );
}
