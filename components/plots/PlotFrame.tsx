import type { ReactNode } from 'react';
import { ClipPath, Defs, G, Line, Rect, Text as SvgText } from 'react-native-svg';
import { useTheme } from '../theme';
import { formatTick } from './scales';

/** One axis of a plot: a d3 scale (any numeric scale works), the ticks d3 picked, a label. */
export interface AxisSpec {
  scale: (v: number) => number;
  /** grid lines */
  grid: number[];
  /** ticks that get a label (a subset of grid, or the same) */
  labelled: number[];
  label: string;
  format?: (v: number) => string;
}

export interface PlotMargins {
  top: number;
  right: number;
  bottom: number;
  left: number;
}

export const DEFAULT_MARGINS: PlotMargins = { top: 10, right: 14, bottom: 34, left: 52 };

interface Props {
  /** id unique in the page, for the clip path */
  clipId: string;
  width: number;
  height: number;
  margins: PlotMargins;
  x: AxisSpec;
  y: AxisSpec;
  /** skip the x tick labels and the x label (upper panel of a stacked pair) */
  hideXLabels?: boolean;
  children?: ReactNode;
}

/**
 * The frame every plot shares: plot area, grid at d3's ticks, tick labels, axis labels, and
 * a clipped group for the data. Place it inside an <Svg>; children draw in pixel coordinates
 * of the whole frame (the scales already include the margins).
 */
export function PlotFrame({ clipId, width, height, margins, x, y, hideXLabels, children }: Props) {
  const t = useTheme();
  const left = margins.left;
  const right = width - margins.right;
  const top = margins.top;
  const bottom = height - margins.bottom;
  const fx = x.format ?? formatTick;
  const fy = y.format ?? formatTick;
  const inX = (v: number) => v >= left - 0.5 && v <= right + 0.5;
  const inY = (v: number) => v >= top - 0.5 && v <= bottom + 0.5;
  const tickFont = { fontSize: 11, fill: t.colors.textMuted, fontFamily: t.font.regular } as const;
  return (
    <G>
      <Defs>
        <ClipPath id={clipId}>
          <Rect x={left} y={top} width={Math.max(0, right - left)} height={Math.max(0, bottom - top)} />
        </ClipPath>
      </Defs>
      <Rect x={left} y={top} width={Math.max(0, right - left)} height={Math.max(0, bottom - top)} fill={t.colors.surface} stroke={t.colors.border} />
      {x.grid.map((v) => {
        const px = x.scale(v);
        return inX(px) ? <Line key={`xg${v}`} x1={px} x2={px} y1={top} y2={bottom} stroke={t.colors.surfaceAlt} strokeWidth={1} /> : null;
      })}
      {y.grid.map((v) => {
        const py = y.scale(v);
        return inY(py) ? <Line key={`yg${v}`} x1={left} x2={right} y1={py} y2={py} stroke={t.colors.surfaceAlt} strokeWidth={1} /> : null;
      })}
      {!hideXLabels &&
        x.labelled.map((v) => {
          const px = x.scale(v);
          return inX(px) ? (
            <SvgText key={`xl${v}`} x={px} y={bottom + 14} textAnchor="middle" {...tickFont}>
              {fx(v)}
            </SvgText>
          ) : null;
        })}
      {y.labelled.map((v) => {
        const py = y.scale(v);
        return inY(py) ? (
          <SvgText key={`yl${v}`} x={left - 6} y={py + 4} textAnchor="end" {...tickFont}>
            {fy(v)}
          </SvgText>
        ) : null;
      })}
      {!hideXLabels && (
        <SvgText x={(left + right) / 2} y={height - 4} textAnchor="middle" fontSize={12} fill={t.colors.text} fontFamily={t.font.medium}>
          {x.label}
        </SvgText>
      )}
      <SvgText
        x={12}
        y={(top + bottom) / 2}
        textAnchor="middle"
        fontSize={12}
        fill={t.colors.text}
        fontFamily={t.font.medium}
        transform={`rotate(-90 12 ${(top + bottom) / 2})`}
      >
        {y.label}
      </SvgText>
      <G clipPath={`url(#${clipId})`}>{children}</G>
    </G>
  );
}
