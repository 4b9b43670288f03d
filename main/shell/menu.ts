/**
 * The native menu as data. Items either send a `MenuCommand` to the renderer (which owns the
 * course state, undo history and unsaved-changes flag), use one of Electron's built-in roles
 * (clipboard, zoom, quit), or ask the shell for one of its own dialogs (about, cautions).
 * `toTemplate` turns the data into Electron's template with click handlers; tests read the data.
 */
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand } from '../ipc/channels';

export type ShellAction = 'about' | 'cautions';

export type MenuRole = NonNullable<MenuItemConstructorOptions['role']>;

export type MenuEntry =
  | { readonly type: 'separator' }
  | { readonly label: string; readonly accelerator?: string; readonly command: MenuCommand; readonly enabled?: boolean }
  | { readonly label?: string; readonly accelerator?: string; readonly role: MenuRole }
  | { readonly label: string; readonly shell: ShellAction }
  | { readonly label: string; readonly submenu: readonly MenuEntry[] };

export interface MenuSection {
  readonly label: string;
  readonly role?: MenuRole;
  readonly items: readonly MenuEntry[];
}

export interface MenuContext {
  readonly platform: NodeJS.Platform;
  readonly recentFiles: readonly string[];
  /** Developer tools only in an unpackaged build. */
  readonly developer: boolean;
}

const separator = { type: 'separator' } as const;

/** The base name of a path on any platform, for the "Open recent" labels. */
function baseName(path: string): string {
  const parts = path.split(/[\\/]/);
  return parts[parts.length - 1] || path;
}

function recentEntries(paths: readonly string[]): MenuEntry[] {
  if (paths.length === 0) return [{ label: 'No recent files', command: 'open-project', enabled: false }];
  // Label with the name and the full path: two files of one name in different folders stay apart.
  return paths.map((path) => ({ label: `${baseName(path)} — ${path}`, command: { kind: 'open-recent', path } }));
}

export function menuSections(context: MenuContext): MenuSection[] {
  const mac = context.platform === 'darwin';
  const sections: MenuSection[] = [];
  if (mac) {
    sections.push({
      label: 'Weighbridge',
      role: 'appMenu',
      items: [{ label: 'About Weighbridge', shell: 'about' }, separator, { role: 'hide' }, { role: 'hideOthers' }, { role: 'unhide' }, separator, { label: 'Quit Weighbridge', accelerator: 'CmdOrCtrl+Q', role: 'quit' }],
    });
  }
  sections.push({
    label: '&File',
    items: [
      { label: 'Open project…', accelerator: 'CmdOrCtrl+O', command: 'open-project' },
      { label: 'Import spreadsheet…', accelerator: 'CmdOrCtrl+I', command: 'import-spreadsheet' },
      { label: 'Open recent', submenu: recentEntries(context.recentFiles) },
      separator,
      { label: 'Save', accelerator: 'CmdOrCtrl+S', command: 'save' },
      { label: 'Save as…', accelerator: 'CmdOrCtrl+Shift+S', command: 'save-as' },
      separator,
      { label: 'Export final marks…', accelerator: 'CmdOrCtrl+E', command: 'export' },
      ...(mac ? [] : [separator, { label: 'Quit', accelerator: 'CmdOrCtrl+Q', role: 'quit' } as const]),
    ],
  });
  sections.push({
    label: '&Edit',
    items: [
      { label: 'Undo', accelerator: 'CmdOrCtrl+Z', command: 'undo' },
      // Windows users expect Ctrl+Y; elsewhere the convention is Shift+Z (common practice, no source).
      { label: 'Redo', accelerator: context.platform === 'win32' ? 'CmdOrCtrl+Y' : 'CmdOrCtrl+Shift+Z', command: 'redo' },
      separator,
      { role: 'cut' },
      { role: 'copy' },
      { role: 'paste' },
      { role: 'selectAll' },
    ],
  });
  sections.push({
    label: '&View',
    items: [
      { role: 'resetZoom' },
      { role: 'zoomIn' },
      { role: 'zoomOut' },
      separator,
      { role: 'togglefullscreen' },
      ...(context.developer ? [separator, { role: 'toggleDevTools' } as const] : []),
    ],
  });
  sections.push({
    label: '&Help',
    role: 'help',
    items: [...(mac ? [] : [{ label: 'About Weighbridge', shell: 'about' } as const]), { label: 'Cautions before submitting marks', shell: 'cautions' }],
  });
  return sections;
}

export interface MenuActions {
  sendCommand(command: MenuCommand): void;
  runShellAction(action: ShellAction): void;
}

function toItem(entry: MenuEntry, actions: MenuActions): MenuItemConstructorOptions {
  if ('type' in entry) return { type: 'separator' };
  if ('submenu' in entry) return { label: entry.label, submenu: entry.submenu.map((e) => toItem(e, actions)) };
  if ('command' in entry) {
    const command = entry.command;
    return { label: entry.label, accelerator: entry.accelerator, enabled: entry.enabled ?? true, click: () => actions.sendCommand(command) };
  }
  if ('shell' in entry) {
    const action = entry.shell;
    return { label: entry.label, click: () => actions.runShellAction(action) };
  }
  return { role: entry.role, ...(entry.label ? { label: entry.label } : {}), ...(entry.accelerator ? { accelerator: entry.accelerator } : {}) };
}

/** Electron's `Menu.buildFromTemplate` input. */
export function toTemplate(sections: readonly MenuSection[], actions: MenuActions): MenuItemConstructorOptions[] {
  return sections.map((section) => ({
    label: section.label,
    // The help role gives macOS its menu search; the app menu is the first menu by position, so
    // its role is not passed (with a role, Electron would replace our items with its defaults).
    ...(section.role === 'help' ? { role: 'help' as const } : {}),
    submenu: section.items.map((e) => toItem(e, actions)),
  }));
}

/** The reminders shown under Help, and before the first export. */
export const cautionsText = [
  'Review every final mark against your institution’s own grading policy before you submit it.',
  'Exported files and project files hold identifiable student data: store and share them as your institution requires.',
  'Weighbridge works only on this computer; it sends nothing over the network.',
].join('\n\n');
