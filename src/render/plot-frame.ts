import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';

/** Plot draws into a DOM; on the server a small standalone one is enough. */
export const { document } = parseHTML('<!doctype html><html><body></body></html>');

export const WIDTH = 430;
export const HEIGHT = 270;
export const MARGIN = { left: 58, right: 16, top: 20, bottom: 30 };
// Black and white print: marks differ by line style and symbol, never by colour alone.
export const INK = '#111';
const STYLE = { fontSize: '11px', background: 'white', color: INK, overflow: 'visible' };

export interface PlotUnits {
  energy: string;
  length: string;
  parameters: Record<string, string | null>;
}

/** One figure as SVG markup, with its caption sentence. */
export function draw(options: Plot.PlotOptions, caption: string): string {
  const figure = Plot.plot({
    document,
    width: WIDTH,
    height: HEIGHT,
    marginLeft: MARGIN.left,
    marginRight: MARGIN.right,
    marginTop: MARGIN.top,
    marginBottom: MARGIN.bottom,
    style: STYLE,
    caption,
    ...options,
  }) as unknown as { outerHTML: string };
  return figure.outerHTML;
}
