import { scaleLinear } from 'd3-scale';
import { View } from 'react-native';
import Svg, { Circle, G, Line, Path } from 'react-native-svg';
import { useTheme } from '../theme';
import { Legend } from './Legend';
import { PlotFrame, type PlotMargins } from './PlotFrame';
import { equalAspectDomains, linearTicks, type Root } from './scales';

export type { Root } from './scales';

export interface RootSeries {
  key: string;
  label: string;
  color: string;
  poles: Root[];
  zeros: Root[];
}

interface Props {
  width: number;
  plane: 'z' | 's';
  series: RootSeries[];
  /** z-plane: frame the roots instead of the whole unit circle (roots crowd near z = 1 at high rates) */
  zoom?: boolean;
  testID?: string;
}

const MARGINS: PlotMargins = { top: 10, right: 14, bottom: 34, left: 52 };

/** Pole–zero map: poles as ×, zeros as ○; the z-plane shows the unit circle, the s-plane the imaginary axis. */
export function PoleZeroMap({ width, plane, series, zoom, testID }: Props) {
  const t = useTheme();
  const height = Math.round(Math.min(Math.max(width * 0.8, 240), 380));
  if (width < 120) return <View testID={testID} style={{ height }} />;
  const plotW = width - MARGINS.left - MARGINS.right;
  const plotH = height - MARGINS.top - MARGINS.bottom;
  const all = series.flatMap((s) => [...s.poles, ...s.zeros]).filter((r) => Number.isFinite(r.re) && Number.isFinite(r.im));
  const d = equalAspectDomains(all, plane, plotW, plotH, zoom);
  const x = scaleLinear().domain(d.re).range([MARGINS.left, width - MARGINS.right]);
  const y = scaleLinear().domain(d.im).range([height - MARGINS.bottom, MARGINS.top]);
  const xTicks = linearTicks(d.re, plotW, 60);
  const yTicks = linearTicks(d.im, plotH, 45);
  const size = 5;
  const axisLabel = plane === 'z' ? 'Re z' : 'Re s (rad/s)';
  const yLabel = plane === 'z' ? 'Im z' : 'Im s (rad/s)';
  return (
    <View testID={testID}>
      <Svg width={width} height={height}>
        <PlotFrame
          clipId={`${testID ?? 'pz'}-${plane}`}
          width={width}
          height={height}
          margins={MARGINS}
          x={{ scale: x, grid: xTicks, labelled: xTicks, label: axisLabel }}
          y={{ scale: y, grid: yTicks, labelled: yTicks, label: yLabel }}
        >
          <Line x1={x(d.re[0])} x2={x(d.re[1])} y1={y(0)} y2={y(0)} stroke={t.colors.border} strokeWidth={1} />
          <Line x1={x(0)} x2={x(0)} y1={y(d.im[0])} y2={y(d.im[1])} stroke={plane === 's' ? t.colors.textMuted : t.colors.border} strokeWidth={1} />
          {plane === 'z' && (
            <Circle cx={x(0)} cy={y(0)} r={x(1) - x(0)} stroke={t.colors.textMuted} strokeWidth={1.2} strokeDasharray="4 3" fill="none" />
          )}
          {series.map((s) => (
            <G key={s.key}>
              {s.zeros.map((r, i) => (
                <Circle key={`z${i}`} cx={x(r.re)} cy={y(r.im)} r={size} stroke={s.color} strokeWidth={1.8} fill="none" />
              ))}
              {s.poles.map((r, i) => {
                const cx = x(r.re);
                const cy = y(r.im);
                return (
                  <Path
                    key={`p${i}`}
                    d={`M${cx - size},${cy - size}L${cx + size},${cy + size}M${cx - size},${cy + size}L${cx + size},${cy - size}`}
                    stroke={s.color}
                    strokeWidth={2}
                  />
                );
              })}
            </G>
          ))}
        </PlotFrame>
      </Svg>
      <Legend items={series.map((s) => ({ key: s.key, label: s.label, color: s.color }))} />
    </View>
  );
}
