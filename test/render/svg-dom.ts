/**
 * Parses an SVG file for structural checks with svgdom's DOM, whose XML reader (sax in strict
 * mode) throws on any well-formedness error.
 */
import { createSVGWindow } from 'svgdom';

export function parseSvg(text: string): Element {
  const window = createSVGWindow();
  const holder = window.document.documentElement as unknown as Element;
  holder.innerHTML = text.replace(/^<\?xml[^>]*>\s*/, '');
  const svg = holder.firstElementChild;
  if (svg?.nodeName !== 'svg') throw new Error('not an SVG document');
  return svg;
}

export function all(root: Element, selector: string): Element[] {
  return [...root.querySelectorAll(selector)];
}

/** [x, y] pairs of a polygon or polyline's points attribute. */
export function pointList(element: Element): Array<[number, number]> {
  return (element.getAttribute('points') ?? '')
    .trim()
    .split(/\s+/)
    .map((p) => {
      const [x, y] = p.split(',').map(Number);
      return [x!, y!];
    });
}
