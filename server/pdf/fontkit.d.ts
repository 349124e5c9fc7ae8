/** The little of fontkit (pdfkit's own font parser, installed with pdfkit) that server/pdf uses. */
declare module "fontkit" {
  export interface FontkitFont {
    readonly postscriptName: string;
    readonly familyName: string;
    readonly characterSet: number[];
    hasGlyphForCodePoint(codePoint: number): boolean;
    layout(text: string): unknown;
  }
  export function create(buffer: Uint8Array, postscriptName?: string): FontkitFont;
}
