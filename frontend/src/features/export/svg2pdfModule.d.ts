// The ES build of svg2pdf.js, imported by path so that Vite and Vitest (which would otherwise pick the
// UMD build under Node resolution) load the same module.
declare module 'svg2pdf.js/dist/svg2pdf.es.min.js' {
  export { svg2pdf } from 'svg2pdf.js';
}
