import { useEffect, type RefObject } from 'react';
import { commandForKey, type ShortcutCommand } from '~/lib/editor/shortcuts';
import type { CommandArgs } from './editor-commands';

/**
 * The editor's keys: active while the focus is inside the editor (or nowhere), not while a
 * dialog is open, and not while typing in a field (except Ctrl+S).
 */
export function useEditorKeys(root: RefObject<HTMLElement | null>, run: RefObject<(command: ShortcutCommand, args: CommandArgs) => void>) {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const el = root.current;
      const target = e.target as HTMLElement | null;
      if (!el || !target) return;
      if (!(el.contains(target) || target === document.body)) return;
      if (document.querySelector('dialog[open]')) return;
      const hit = commandForKey(e);
      if (!hit) return;
      const typing = target.closest('input, textarea, select, [contenteditable="true"]');
      if (typing && hit.command !== 'save') return;
      if ((e.key === ' ' || e.key === 'Enter') && target.closest('button, summary, a')) return;
      e.preventDefault();
      run.current?.(hit.command, { index: hit.index, bypass: e.altKey });
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [root, run]);
}
