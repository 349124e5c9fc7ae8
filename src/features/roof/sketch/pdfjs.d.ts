// pdfjs-dist ships its types for the package root only; the browser build at this path has the same API.
declare module "pdfjs-dist/build/pdf.mjs" {
  export * from "pdfjs-dist";
}
