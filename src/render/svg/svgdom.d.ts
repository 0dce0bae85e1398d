/** The svgdom package ships without types; only its window factory is used. */
declare module 'svgdom' {
  export function createSVGWindow(): Window & typeof globalThis;
}
