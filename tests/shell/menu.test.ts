/**
 * The native menu: every usual command is there with its usual accelerator (common practice, no
 * source: the platform conventions for Open/Save/Undo…; Electron's `CmdOrCtrl` maps to ⌘ on macOS
 * and Ctrl elsewhere), and each item reaches the renderer as a command.
 */
import { describe, expect, it } from 'vitest';
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand } from '../../main/ipc/channels';
import { menuSections, toTemplate, type MenuEntry, type MenuSection } from '../../main/shell/menu';

function flatten(sections: readonly MenuSection[]): MenuEntry[] {
  const out: MenuEntry[] = [];
  const walk = (entries: readonly MenuEntry[]) => {
    for (const e of entries) {
      out.push(e);
      if ('submenu' in e) walk(e.submenu);
    }
  };
  for (const s of sections) walk(s.items);
  return out;
}

function accelerators(sections: readonly MenuSection[]): Map<string, string> {
  const map = new Map<string, string>();
  for (const e of flatten(sections)) {
    if ('accelerator' in e && e.accelerator) {
      const what = 'command' in e ? (typeof e.command === 'string' ? e.command : e.command.kind) : 'role' in e ? e.role : '';
      map.set(what, e.accelerator);
    }
  }
  return map;
}

describe('menu', () => {
  for (const platform of ['linux', 'win32', 'darwin'] as const) {
    it(`has every accelerator on ${platform}`, () => {
      const acc = accelerators(menuSections({ platform, recentFiles: [], developer: false }));
      expect(acc.get('open-project')).toBe('CmdOrCtrl+O');
      expect(acc.get('import-spreadsheet')).toBe('CmdOrCtrl+I');
      expect(acc.get('save')).toBe('CmdOrCtrl+S');
      expect(acc.get('save-as')).toBe('CmdOrCtrl+Shift+S');
      expect(acc.get('export')).toBe('CmdOrCtrl+E');
      expect(acc.get('undo')).toBe('CmdOrCtrl+Z');
      expect(acc.get('redo')).toBe(platform === 'win32' ? 'CmdOrCtrl+Y' : 'CmdOrCtrl+Shift+Z');
      expect(acc.get('quit')).toBe('CmdOrCtrl+Q');
      // No two items share a shortcut.
      expect(new Set(acc.values()).size).toBe(acc.size);
    });
  }

  it('has File, Edit, View and Help, with clipboard roles in Edit', () => {
    const sections = menuSections({ platform: 'linux', recentFiles: [], developer: false });
    expect(sections.map((s) => s.label.replace('&', ''))).toEqual(['File', 'Edit', 'View', 'Help']);
    const edit = sections[1]?.items ?? [];
    const roles = edit.flatMap((e) => ('role' in e ? [e.role] : []));
    expect(roles).toEqual(expect.arrayContaining(['cut', 'copy', 'paste']));
  });

  it('lists recent files under Open recent, each sending open-recent with its path', () => {
    const recent = ['/home/me/Course A.weighbridge', 'C:\\Users\\me\\marks.xlsx'];
    const sent: MenuCommand[] = [];
    const sections = menuSections({ platform: 'linux', recentFiles: recent, developer: false });
    const template = toTemplate(sections, { sendCommand: (c) => sent.push(c), runShellAction: () => undefined });
    const file = template[0]?.submenu as MenuItemConstructorOptions[];
    const openRecent = file.find((i) => i.label === 'Open recent');
    const items = openRecent?.submenu as MenuItemConstructorOptions[];
    expect(items.map((i) => i.label)).toEqual(['Course A.weighbridge — /home/me/Course A.weighbridge', 'marks.xlsx — C:\\Users\\me\\marks.xlsx']);
    for (const i of items) (i.click as () => void)();
    expect(sent).toEqual(recent.map((path) => ({ kind: 'open-recent', path })));
  });

  it('shows a disabled placeholder when there are no recent files', () => {
    const entries = flatten(menuSections({ platform: 'linux', recentFiles: [], developer: false }));
    const placeholder = entries.find((e) => 'label' in e && e.label === 'No recent files');
    expect(placeholder && 'enabled' in placeholder && placeholder.enabled).toBe(false);
  });

  it('sends each command item to the renderer when clicked', () => {
    const sent: MenuCommand[] = [];
    const template = toTemplate(menuSections({ platform: 'linux', recentFiles: [], developer: false }), { sendCommand: (c) => sent.push(c), runShellAction: () => undefined });
    const click = (menu: number, label: string) => {
      const item = (template[menu]?.submenu as MenuItemConstructorOptions[]).find((i) => i.label === label);
      (item?.click as () => void)();
    };
    click(0, 'Open project…');
    click(0, 'Import spreadsheet…');
    click(0, 'Save');
    click(0, 'Save as…');
    click(0, 'Export final marks…');
    click(1, 'Undo');
    click(1, 'Redo');
    expect(sent).toEqual(['open-project', 'import-spreadsheet', 'save', 'save-as', 'export', 'undo', 'redo']);
  });

  it('offers About and Cautions under Help, and developer tools only in an unpackaged build', () => {
    const actions: string[] = [];
    const template = toTemplate(menuSections({ platform: 'linux', recentFiles: [], developer: false }), { sendCommand: () => undefined, runShellAction: (a) => actions.push(a) });
    for (const i of template[3]?.submenu as MenuItemConstructorOptions[]) (i.click as () => void)();
    expect(actions).toEqual(['about', 'cautions']);
    const roles = (dev: boolean) => flatten(menuSections({ platform: 'linux', recentFiles: [], developer: dev })).flatMap((e) => ('role' in e ? [e.role] : []));
    expect(roles(false)).not.toContain('toggleDevTools');
    expect(roles(true)).toContain('toggleDevTools');
  });

  it('puts Quit in the application menu on macOS and in File elsewhere', () => {
    const mac = menuSections({ platform: 'darwin', recentFiles: [], developer: false });
    expect(mac[0]?.items.some((e) => 'role' in e && e.role === 'quit')).toBe(true);
    expect(mac[1]?.items.some((e) => 'role' in e && e.role === 'quit')).toBe(false);
    const linux = menuSections({ platform: 'linux', recentFiles: [], developer: false });
    expect(linux[0]?.items.some((e) => 'role' in e && e.role === 'quit')).toBe(true);
  });
});
