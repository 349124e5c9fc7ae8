/**
 * Fetches an underlay's file and makes something an SVG `<image>` can show: an image file as it is
 * (an object URL), a PDF's chosen page rendered to a PNG in the browser (kept in memory only; the
 * roof document keeps the file's URL and the page number). Results are cached per file and page.
 */
import { useEffect, useState } from "react";

export interface UnderlayImage {
  /** What the `<image>` shows (object URL or data URL). */
  url: string;
  /** The picture's size in pixels. */
  width: number;
  height: number;
  /** Pages in the PDF; 1 for an image. */
  pageCount: number;
  pdf: boolean;
}

const cache = new Map<string, Promise<UnderlayImage>>();
const MAX_CACHED = 12;

const isPdf = async (blob: Blob) => {
  if (blob.type === "application/pdf") return true;
  const head = new Uint8Array(await blob.slice(0, 5).arrayBuffer());
  return String.fromCharCode(...head) === "%PDF-";
};

function measure(url: string): Promise<{ width: number; height: number }> {
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => resolve({ width: img.naturalWidth, height: img.naturalHeight });
    img.onerror = () => reject(new Error("The plan file is not an image this browser can show (use JPEG, PNG, WebP or PDF)."));
    img.src = url;
  });
}

async function load(src: string, page: number): Promise<UnderlayImage> {
  const res = await fetch(src, { credentials: "same-origin" });
  if (!res.ok) throw new Error(res.status === 404 ? "The plan file was not found (it may have been deleted)." : `The plan file could not be loaded (HTTP ${res.status}).`);
  const blob = await res.blob();
  if (await isPdf(blob)) {
    const { renderPdfPage } = await import("./pdf-page");
    return renderPdfPage(await blob.arrayBuffer(), page);
  }
  if (typeof URL.createObjectURL !== "function") throw new Error("This browser cannot show the plan image.");
  const url = URL.createObjectURL(blob);
  try {
    const size = await measure(url);
    return { url, ...size, pageCount: 1, pdf: false };
  } catch (e) {
    URL.revokeObjectURL(url);
    throw e;
  }
}

/** The picture for `src` (and `page`, for PDFs); failures are not cached, so a retry fetches again. */
export function loadUnderlayImage(src: string, page = 1): Promise<UnderlayImage> {
  const key = `${src}#${page}`;
  let p = cache.get(key);
  if (!p) {
    p = load(src, page);
    cache.set(key, p);
    p.catch(() => cache.delete(key));
    if (cache.size > MAX_CACHED) cache.delete(cache.keys().next().value!);
  }
  return p;
}

/** Puts an already rendered picture in the cache (after an upload, the file is at hand). */
export function primeUnderlayImage(src: string, page: number, image: UnderlayImage) {
  cache.set(`${src}#${page}`, Promise.resolve(image));
}

export type UnderlayImageState =
  | { status: "idle" }
  | { status: "loading" }
  | { status: "ready"; image: UnderlayImage }
  | { status: "error"; error: string };

/** The picture of the current underlay, loading when `src` or `page` changes. */
export function useUnderlayImage(src: string | null | undefined, page = 1): UnderlayImageState & { retry: () => void } {
  const [state, setState] = useState<UnderlayImageState>({ status: "idle" });
  const [attempt, setAttempt] = useState(0);
  useEffect(() => {
    if (!src) {
      setState({ status: "idle" });
      return;
    }
    let live = true;
    setState({ status: "loading" });
    loadUnderlayImage(src, page).then(
      (image) => live && setState({ status: "ready", image }),
      (e: unknown) => live && setState({ status: "error", error: e instanceof Error ? e.message : "The plan could not be shown." }),
    );
    return () => {
      live = false;
    };
  }, [src, page, attempt]);
  return { ...state, retry: () => setAttempt((n) => n + 1) };
}
