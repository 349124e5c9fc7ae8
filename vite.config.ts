import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import { fileURLToPath } from "node:url";

const dir = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export const aliases = {
  "@/": dir("./src/"),
  "@server/": dir("./server/"),
  "@shared/": dir("./shared/"),
};

export default defineConfig({
  plugins: [react()],
  resolve: {
    alias: Object.entries(aliases).map(([find, replacement]) => ({ find, replacement })),
  },
  server: {
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { "/api": `http://127.0.0.1:${process.env.PORT ?? 3000}` },
  },
  build: { outDir: "dist", sourcemap: false, chunkSizeWarningLimit: 700 },
});
