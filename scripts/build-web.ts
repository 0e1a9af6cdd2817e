/**
 * Builds the workspace page into dist/web/ (served at / by src/http/routes/root.ts):
 *   index.html      copied from web/index.html
 *   assets/app.js   web/src/main.ts bundled with d3-geo, d3-scale-chromatic, topojson-client and uPlot (esbuild)
 *   assets/app.css  web/src/style.css with uPlot's stylesheet
 *   assets/land-50m.json   Natural Earth land outline (world-atlas, TopoJSON)
 * Run by `npm run build` (and by the page tests); takes about a second.
 */

import { copyFileSync, mkdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
export const WEB_OUT_DIR = join(root, 'dist', 'web');

export async function buildWeb(outDir = WEB_OUT_DIR): Promise<void> {
  const assets = join(outDir, 'assets');
  mkdirSync(assets, { recursive: true });
  await build({
    entryPoints: { app: join(root, 'web', 'src', 'main.ts') },
    outdir: assets,
    bundle: true,
    format: 'esm',
    target: 'es2020',
    minify: true,
    sourcemap: false,
    legalComments: 'linked',
    logLevel: 'warning',
    absWorkingDir: root,
  });
  copyFileSync(join(root, 'web', 'index.html'), join(outDir, 'index.html'));
  const require = createRequire(import.meta.url);
  copyFileSync(require.resolve('world-atlas/land-50m.json'), join(assets, 'land-50m.json'));
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  await buildWeb();
  console.log(`wrote ${WEB_OUT_DIR}`);
}
