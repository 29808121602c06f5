/**
 * Shared geometry for the site's build-time SVG figures: a plotting frame with
 * linear axes, ticks and labels. Figures are plain SVG strings (no client code),
 * so pages stay static and print well.
 */
import { escapeHtml } from '../markdown.ts';

export interface Axis {
  label: string;
  min: number;
  max: number;
  ticks: { value: number; label: string }[];
}

export interface Frame {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
  x(value: number): number;
  y(value: number): number;
}

export function makeFrame(width: number, height: number, xAxis: Axis, yAxis: Axis): Frame {
  const left = 58, right = 12, top = 12, bottom = 44;
  const plotWidth = width - left - right;
  const plotHeight = height - top - bottom;
  const xSpan = xAxis.max - xAxis.min || 1;
  const ySpan = yAxis.max - yAxis.min || 1;
  return {
    width, height, left, right, top, bottom,
    x: (value) => left + ((value - xAxis.min) / xSpan) * plotWidth,
    y: (value) => top + (1 - (value - yAxis.min) / ySpan) * plotHeight,
  };
}

const fmt = (value: number) => (Math.round(value * 100) / 100).toString();

/** Axes box, ticks and axis labels. */
export function drawAxes(frame: Frame, xAxis: Axis, yAxis: Axis): string {
  const { left, top, width, height, right, bottom } = frame;
  const parts: string[] = [
    `<rect x="${left}" y="${top}" width="${width - left - right}" height="${height - top - bottom}" class="plot-box"/>`,
  ];
  for (const tick of xAxis.ticks) {
    const x = fmt(frame.x(tick.value));
    parts.push(`<line x1="${x}" x2="${x}" y1="${height - bottom}" y2="${height - bottom + 4}" class="plot-tick"/>`);
    parts.push(`<text x="${x}" y="${height - bottom + 16}" text-anchor="middle" class="plot-tick-label">${escapeHtml(tick.label)}</text>`);
  }
  for (const tick of yAxis.ticks) {
    const y = fmt(frame.y(tick.value));
    parts.push(`<line x1="${left - 4}" x2="${left}" y1="${y}" y2="${y}" class="plot-tick"/>`);
    parts.push(`<text x="${left - 7}" y="${y}" dy="0.35em" text-anchor="end" class="plot-tick-label">${escapeHtml(tick.label)}</text>`);
  }
  parts.push(`<text x="${left + (width - left - right) / 2}" y="${height - 6}" text-anchor="middle" class="plot-axis-label">${escapeHtml(xAxis.label)}</text>`);
  parts.push(`<text transform="translate(14 ${top + (height - top - bottom) / 2}) rotate(-90)" text-anchor="middle" class="plot-axis-label">${escapeHtml(yAxis.label)}</text>`);
  return parts.join('');
}

export function svgDocument(frame: Frame, title: string, body: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${frame.width} ${frame.height}" role="img" aria-label="${escapeHtml(title)}" class="plot"><title>${escapeHtml(title)}</title>${body}</svg>`;
}

export { fmt as formatCoordinate };

/** The quasienergy axis in units of π/T, from −1 to 1. */
export function quasienergyAxis(): Axis {
  return {
    label: 'quasienergy ε',
    min: -1,
    max: 1,
    ticks: [
      { value: -1, label: '−π/T' },
      { value: -0.5, label: '−π/2T' },
      { value: 0, label: '0' },
      { value: 0.5, label: 'π/2T' },
      { value: 1, label: 'π/T' },
    ],
  };
}

/** A momentum axis in reduced units s ∈ [0, 1]. */
export function momentumAxis(label: string): Axis {
  return { label, min: 0, max: 1, ticks: [0, 0.25, 0.5, 0.75, 1].map((value) => ({ value, label: String(value) })) };
}
