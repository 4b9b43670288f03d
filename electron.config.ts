/**
 * Packaging (electron-builder). Cannot run on the machines this was written on (it downloads the
 * Electron zip and the AppImage/deb/nsis/dmg tools); on a networked machine:
 *   npm run build && npx electron-builder --config electron.config.ts --linux   (or --win, --mac)
 *
 * Fuses are flipped in the packaged binary (Electron docs, "Security" tutorial, and the "Electron
 * Fuses" tutorial): no ELECTRON_RUN_AS_NODE, no NODE_OPTIONS, no --inspect, code only from the
 * integrity-checked app.asar, no extra privileges for file://.
 */
import type { Configuration } from 'electron-builder';

const config: Configuration = {
  appId: 'org.weighbridge.desktop',
  productName: 'Weighbridge',
  copyright: 'Weighbridge contributors',
  directories: { output: 'release', buildResources: 'build' },
  files: ['dist/**', 'demo-data/**', 'package.json', '!**/*.map'],
  extraMetadata: { main: 'dist/main/shell.cjs' },
  asar: true,
  // worker_threads start the import worker from a real file, so it lives beside the archive.
  asarUnpack: ['dist/main/importWorker.mjs'],
  // Everything is bundled by esbuild/Vite; there are no native modules to rebuild.
  npmRebuild: false,
  // Releases are never uploaded from a build.
  publish: null,
  fileAssociations: [{ ext: 'weighbridge', name: 'Weighbridge project', role: 'Editor' }],
  electronFuses: {
    runAsNode: false,
    enableCookieEncryption: true,
    enableNodeOptionsEnvironmentVariable: false,
    enableNodeCliInspectArguments: false,
    enableEmbeddedAsarIntegrityValidation: true,
    onlyLoadAppFromAsar: true,
    grantFileProtocolExtraPrivileges: false,
  },
  linux: {
    target: ['AppImage', 'deb'],
    category: 'Education',
    executableName: 'weighbridge',
    maintainer: 'Weighbridge contributors',
  },
  win: {
    target: ['nsis'],
  },
  nsis: {
    oneClick: false,
    perMachine: false,
    allowToChangeInstallationDirectory: true,
  },
  mac: {
    target: ['dmg'],
    category: 'public.app-category.education',
    hardenedRuntime: true,
  },
};

export default config;
