// Types of svg2pdf.js's ES build (the package declares them for its main file only).
declare module 'svg2pdf.js/dist/svg2pdf.es.js' {
  export * from 'svg2pdf.js';
}

// Vite's URL import of a font file shipped with the app (the PDF export embeds it).
declare module '*.ttf?url' {
  const url: string;
  export default url;
}
