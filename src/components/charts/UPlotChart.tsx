import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

type Props = {
  /**
   * Everything but the size, which follows the host's width. Pass a stable object (useMemo):
   * a new options or data object builds a new chart.
   */
  options: Omit<uPlot.Options, 'width' | 'height'>;
  data: uPlot.AlignedData;
  /** Height of plot and axes in CSS pixels, fixed or from the width. */
  height: number | ((widthPx: number) => number);
  /** The canvas's text alternative: it gets role="img" and this as its aria-label. */
  label: string;
  className?: string;
};

/** Below this the axes would eat the plot; a narrower host scrolls rather than squeezes. */
const MIN_WIDTH_PX = 240;

/**
 * A uPlot chart as a React component: creates the chart in the host element, sizes it to the
 * host's width (and follows it with a ResizeObserver), and destroys it on unmount or when its
 * options or data change. Browser only: uPlot measures and draws on a canvas.
 */
export function UPlotChart({ options, data, height, label, className }: Props) {
  const hostRef = useRef<HTMLDivElement>(null);
  const chartRef = useRef<uPlot | null>(null);
  const heightRef = useRef(height);
  heightRef.current = height;

  useEffect(() => {
    const host = hostRef.current;
    if (!host) return;
    const sizeFor = (widthPx: number) => {
      const width = Math.max(MIN_WIDTH_PX, Math.floor(widthPx));
      const wanted = heightRef.current;
      return { width, height: typeof wanted === 'function' ? wanted(width) : wanted };
    };
    const chart = new uPlot({ ...options, ...sizeFor(host.clientWidth) }, data, host);
    chartRef.current = chart;
    const observer = new ResizeObserver((entries) => {
      const widthPx = entries[0]?.contentRect.width ?? 0;
      if (widthPx <= 0) return; // hidden (a closed panel): keep the last size
      const size = sizeFor(widthPx);
      if (size.width !== chart.width || size.height !== chart.height) chart.setSize(size);
    });
    observer.observe(host);
    return () => {
      observer.disconnect();
      chart.destroy();
      chartRef.current = null;
    };
  }, [options, data]);

  // The label can change without the drawing changing; set it on the canvas apart from the build.
  useEffect(() => {
    const canvas = chartRef.current?.ctx.canvas;
    if (!canvas) return;
    canvas.setAttribute('role', 'img');
    canvas.setAttribute('aria-label', label);
  }, [label, options, data]);

  return <div ref={hostRef} className={className} />;
}
