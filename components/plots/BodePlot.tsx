import { scaleLinear, scaleLog } from 'd3-scale';
import { line } from 'd3-shape';
import { View } from 'react-native';
import Svg, { G, Line, Path, Rect, Text as SvgText } from 'react-native-svg';
import { useTheme } from '../theme';
import { Legend } from './Legend';
import { DEFAULT_MARGINS, PlotFrame } from './PlotFrame';
import { finiteExtent, linearTicks, logAxisTicks, paddedDomain } from './scales';

/** One frequency response: magnitude in dB and phase in degrees at frequencies in Hz. */
export interface BodeSeries {
  key: string;
  label: string;
  color: string;
  dashed?: boolean;
  freqHz: number[];
  magDb: Array<number | null>;
  phaseDeg: Array<number | null>;
}

interface Props {
  width: number;
  series: BodeSeries[];
  /** vertical marker at fs/2 */
  nyquistHz?: number;
  /** the analysis band [0, bandHz] is shaded */
  bandHz?: number;
  testID?: string;
}

/** Lowest magnitude shown, relative to the highest: a zero at z = −1 would otherwise pull the axis to −300 dB. */
const MAG_SPAN_LIMIT_DB = 80;

type Pt = [number, number | null];
const isPt = (d: Pt): d is [number, number] => d[1] !== null && Number.isFinite(d[1]) && d[0] > 0;

/** Bode plot: magnitude (dB) above phase (deg), shared log-frequency axis in Hz. */
export function BodePlot({ width, series, nyquistHz, bandHz, testID }: Props) {
  const t = useTheme();
  const margins = DEFAULT_MARGINS;
  const magH = 190;
  const phaseH = 170;
  const freqExt = finiteExtent(series.map((s) => s.freqHz.filter((f) => f > 0)));
  if (!freqExt || width < 120) return <View testID={testID} style={{ height: magH + phaseH }} />;
  const xDomain: [number, number] = [freqExt.min, freqExt.max > freqExt.min ? freqExt.max : freqExt.min * 10];
  const x = scaleLog().domain(xDomain).range([margins.left, width - margins.right]);
  const xt = logAxisTicks(xDomain);

  const magExt = finiteExtent(series.map((s) => s.magDb));
  const magClipped = magExt ? { min: Math.max(magExt.min, magExt.max - MAG_SPAN_LIMIT_DB), max: magExt.max } : undefined;
  const magDomain = paddedDomain(magClipped, 6);
  const yMag = scaleLinear().domain(magDomain).range([magH - margins.bottom, margins.top]);
  const phaseDomain = paddedDomain(finiteExtent(series.map((s) => s.phaseDeg)), 20);
  const yPh = scaleLinear().domain(phaseDomain).range([phaseH - margins.bottom, margins.top]);

  const path = (ys: (v: number) => number, s: BodeSeries, values: Array<number | null>) =>
    line<Pt>()
      .defined(isPt)
      .x((d) => x(d[0]))
      .y((d) => ys(d[1] as number))(s.freqHz.map((f, i): Pt => [f, values[i] ?? null])) ?? '';

  const markers = (h: number, showText: boolean) => {
    const top = margins.top;
    const bottom = h - margins.bottom;
    const out = [];
    if (bandHz && bandHz > xDomain[0]) {
      const bx = Math.min(x(bandHz), width - margins.right);
      out.push(<Rect key="band" x={margins.left} y={top} width={Math.max(0, bx - margins.left)} height={bottom - top} fill={t.colors.primary} opacity={0.05} />);
      out.push(<Line key="bandl" x1={bx} x2={bx} y1={top} y2={bottom} stroke={t.colors.primary} strokeWidth={1} strokeDasharray="2 3" opacity={0.6} />);
      if (showText) out.push(<SvgText key="bandt" x={bx - 4} y={top + 12} textAnchor="end" fontSize={10} fill={t.colors.primary}>band</SvgText>);
    }
    if (nyquistHz && nyquistHz >= xDomain[0] && nyquistHz <= xDomain[1] * 1.0001) {
      const nx = Math.min(x(nyquistHz), width - margins.right - 1);
      out.push(<Line key="nyq" x1={nx} x2={nx} y1={top} y2={bottom} stroke={t.colors.danger} strokeWidth={1.2} strokeDasharray="5 3" />);
      if (showText) out.push(<SvgText key="nyqt" x={nx - 4} y={top + 24} textAnchor="end" fontSize={10} fill={t.colors.danger}>Nyquist</SvgText>);
    }
    return out;
  };

  const xAxis = { scale: x, grid: xt.grid, labelled: xt.labelled, label: 'frequency (Hz)' };
  return (
    <View testID={testID}>
      <Svg width={width} height={magH + phaseH}>
        <PlotFrame
          clipId={`${testID ?? 'bode'}-mag`}
          width={width}
          height={magH}
          margins={margins}
          x={xAxis}
          y={{ scale: yMag, grid: linearTicks(magDomain, magH - 44), labelled: linearTicks(magDomain, magH - 44), label: 'magnitude (dB)' }}
          hideXLabels
        >
          {markers(magH, true)}
          {series.map((s) => (
            <Path key={s.key} d={path(yMag, s, s.magDb)} stroke={s.color} strokeWidth={s.key === 'continuous' ? 2.4 : 1.6} strokeDasharray={s.dashed ? '6 4' : undefined} fill="none" />
          ))}
        </PlotFrame>
        <G y={magH}>
          <PlotFrame
            clipId={`${testID ?? 'bode'}-phase`}
            width={width}
            height={phaseH}
            margins={margins}
            x={xAxis}
            y={{ scale: yPh, grid: linearTicks(phaseDomain, phaseH - 44), labelled: linearTicks(phaseDomain, phaseH - 44), label: 'phase (deg)' }}
          >
            {markers(phaseH, false)}
            {series.map((s) => (
              <Path key={s.key} d={path(yPh, s, s.phaseDeg)} stroke={s.color} strokeWidth={s.key === 'continuous' ? 2.4 : 1.6} strokeDasharray={s.dashed ? '6 4' : undefined} fill="none" />
            ))}
          </PlotFrame>
        </G>
      </Svg>
      <Legend items={series.map((s) => ({ key: s.key, label: s.label, color: s.color, dashed: s.dashed }))} />
    </View>
  );
}
