declare module "heic-convert" {
  interface HeicConvertOptions {
    buffer: Buffer | ArrayBuffer | Uint8Array;
    format: "JPEG" | "PNG";
    /** JPEG quality, 0–1. */
    quality?: number;
  }
  function convert(options: HeicConvertOptions): Promise<ArrayBuffer | Buffer>;
  export default convert;
}
