import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

// The API runs as its own process; in development Vite forwards /api to it so cookies stay
// first-party (same origin), exactly as in production where Express serves dist/.
const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? 3000}`;
const proxy = { '/api': { target: apiTarget, changeOrigin: false } };

// Vendor groups: the sign-in page needs only react, the router, the query client and the form
// libraries; the table library and every feature screen load later, behind their routes.
const vendorGroups: Array<{ name: string; test: RegExp; priority: number }> = [
  { name: 'vendor-react', test: /[\\/]node_modules[\\/](react|react-dom|scheduler)[\\/]/, priority: 40 },
  { name: 'vendor-router', test: /[\\/]node_modules[\\/](react-router|react-router-dom|cookie|set-cookie-parser)[\\/]/, priority: 30 },
  { name: 'vendor-query', test: /[\\/]node_modules[\\/]@tanstack[\\/](react-query|query-core)[\\/]/, priority: 30 },
  { name: 'vendor-table', test: /[\\/]node_modules[\\/]@tanstack[\\/](react-table|table-core)[\\/]/, priority: 30 },
  { name: 'vendor-forms', test: /[\\/]node_modules[\\/](react-hook-form|@hookform|zod)[\\/]/, priority: 30 },
];

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@': fileURLToPath(new URL('./src', import.meta.url)),
    },
  },
  server: { host: '127.0.0.1', port: 5173, proxy },
  preview: { host: '127.0.0.1', port: 4173, proxy },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    target: 'es2022',
    // Fonts stay files: the server's Content-Security-Policy allows font-src 'self', not data: URIs.
    assetsInlineLimit: (file) => (/\.(woff2?|ttf|otf)$/.test(file) ? false : undefined),
    rolldownOptions: {
      output: {
        codeSplitting: { groups: vendorGroups },
      },
    },
  },
});
