import { SHORTCUTS } from '~/lib/editor/shortcuts';

/** The keyboard help panel, generated from the same table the key handler uses. */
export default function ShortcutHelp({ onClose }: { onClose(): void }) {
  return (
    <section aria-labelledby="keys-title" className="rounded-[10px] border border-ink/40 bg-paper p-4" data-shortcut-help>
      <div className="flex items-center gap-2">
        <h3 id="keys-title" className="text-lg">Keyboard help</h3>
        <button type="button" onClick={onClose} className="ml-auto rounded-[10px] border border-ink/70 px-3 py-1 text-sm font-bold">Close</button>
      </div>
      <p className="mt-1 text-sm text-ink-soft">Keys work while the focus is anywhere in the editor except a text field. Mark while the class plays: split at each change, then set the kind with a digit.</p>
      <dl className="mt-3 grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
        {SHORTCUTS.map((s) => (
          <div key={s.command} className="contents">
            <dt><kbd className="rounded-[4px] border border-stone bg-chalk px-1.5 font-sans font-bold">{s.keys}</kbd></dt>
            <dd>{s.description}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
