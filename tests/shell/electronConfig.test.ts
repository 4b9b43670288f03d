/**
 * Packaging configuration: Electron security checklist #19 (fuses) and #16 (a current Electron
 * major). The fuse list and meanings: electron-builder's FuseOptionsV1 (from @electron/fuses) and
 * the Electron "Fuses" tutorial.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import config from '../../electron.config';
import { item } from './checklist';

const root = resolve(import.meta.dirname, '../..');
const pkg = JSON.parse(readFileSync(resolve(root, 'package.json'), 'utf8')) as { main: string; devDependencies: Record<string, string> };

describe('electron.config.ts', () => {
  it(item(19, 'flips every fuse that can be turned off or on safely'), () => {
    expect(config.electronFuses).toEqual({
      runAsNode: false,
      enableCookieEncryption: true,
      enableNodeOptionsEnvironmentVariable: false,
      enableNodeCliInspectArguments: false,
      enableEmbeddedAsarIntegrityValidation: true,
      onlyLoadAppFromAsar: true,
      grantFileProtocolExtraPrivileges: false,
    });
  });

  it('packs into an asar (needed by the integrity and only-from-asar fuses)', () => {
    expect(config.asar).toBe(true);
  });

  it('builds AppImage and deb for Linux, nsis for Windows and dmg for macOS', () => {
    expect(config.linux?.target).toEqual(['AppImage', 'deb']);
    expect(config.win?.target).toEqual(['nsis']);
    expect(config.mac?.target).toEqual(['dmg']);
  });

  it('has our own app id and product name, and starts the bundled shell', () => {
    expect(config.appId).toBe('org.weighbridge.desktop');
    expect(config.productName).toBe('Weighbridge');
    expect(config.extraMetadata?.main).toBe('dist/main/shell.cjs');
    expect(pkg.main).toBe('dist/main/shell.cjs');
    expect(config.files).toEqual(expect.arrayContaining(['dist/**', 'demo-data/**']));
    expect(config.publish).toBeNull();
  });

  it(item(16, 'uses Electron 45 or newer (the installed package and the pinned devDependency agree)'), () => {
    // Electron 45 was the newest stable major when this was written (from memory: the installed
    // package is 45.5.0); older majors stop receiving Chromium security fixes.
    const installed = JSON.parse(readFileSync(resolve(root, 'node_modules/electron/package.json'), 'utf8')) as { version: string };
    const major = Number(installed.version.split('.')[0]);
    expect(major).toBeGreaterThanOrEqual(45);
    expect(pkg.devDependencies.electron?.split('.')[0]).toBe(String(major));
  });
});
