import { scaleLinear } from 'd3-scale';
import { curveStepAfter, line } from 'd3-shape';
import { View } from 'react-native';
import Svg, { Line, Path } from 'react-native-svg';
import { useTheme } from '../theme';
import { Legend } from './Legend';
import { DEFAULT_MARGINS, PlotFrame } from './PlotFrame';
import { finiteExtent, linearTicks, paddedDomain } from './scales';

/** One step response: output y at times t in seconds. Discrete series are drawn as held samples. */
export interface StepSeries {
  key: string;
  label: string;
  color: string;
  timeS: number[];
  y: Array<number | null>;
  /** sampled output: draw as a staircase (zero-order hold between samples) */
  sampled?: boolean;
}

interface Props {
  width: number;
  series: StepSeries[];
  testID?: string;
}

type Pt = [number, number | null];
const isPt = (d: Pt): d is [number, number] => d[1] !== null && Number.isFinite(d[1]);

/** Closed-loop step responses, continuous against the discrete loops. Final value 1 dashed. */
export function StepPlot({ width, series, testID }: Props) {
  const t = useTheme();
  const height = 240;
  const tExt = finiteExtent(series.map((s) => s.timeS));
  if (!tExt || width < 120) return <View testID={testID} style={{ height }} />;
  const xDomain: [number, number] = [tExt.min, tExt.max > tExt.min ? tExt.max : tExt.min + 1];
  const x = scaleLinear().domain(xDomain).range([DEFAULT_MARGINS.left, width - DEFAULT_MARGINS.right]);
  const yExt = finiteExtent([...series.map((s) => s.y), [0, 1]]);
  const yDomain = paddedDomain(yExt, 0.2);
  const y = scaleLinear().domain(yDomain).range([height - DEFAULT_MARGINS.bottom, DEFAULT_MARGINS.top]);
  const xTicks = linearTicks(xDomain, width - 70, 70);
  const yTicks = linearTicks(yDomain, height - 44, 40);
  return (
    <View testID={testID}>
      <Svg width={width} height={height}>
        <PlotFrame
          clipId={`${testID ?? 'step'}-frame`}
          width={width}
          height={height}
          margins={DEFAULT_MARGINS}
          x={{ scale: x, grid: xTicks, labelled: xTicks, label: 'time (s)' }}
          y={{ scale: y, grid: yTicks, labelled: yTicks, label: 'output' }}
        >
          <Line x1={x(xDomain[0])} x2={x(xDomain[1])} y1={y(1)} y2={y(1)} stroke={t.colors.textMuted} strokeDasharray="3 3" />
          {series.map((s) => {
            const gen = line<Pt>()
              .defined(isPt)
              .x((d) => x(d[0]))
              .y((d) => y(d[1] as number));
            if (s.sampled) gen.curve(curveStepAfter);
            const d = gen(s.timeS.map((tt, i): Pt => [tt, s.y[i] ?? null])) ?? '';
            return <Path key={s.key} d={d} stroke={s.color} strokeWidth={s.key === 'continuous' ? 2.4 : 1.6} fill="none" />;
          })}
        </PlotFrame>
      </Svg>
      <Legend items={series.map((s) => ({ key: s.key, label: s.label, color: s.color }))} />
    </View>
  );
}
