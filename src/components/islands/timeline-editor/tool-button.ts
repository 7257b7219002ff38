/** The look of the editor's tool buttons (toolbar, draft offer, panels). */
export const toolButton =
  'inline-flex items-center gap-1 rounded-[10px] border border-ink/70 px-3 py-2 text-sm font-bold hover:bg-ink hover:text-paper disabled:opacity-50 disabled:hover:bg-transparent disabled:hover:text-ink aria-pressed:bg-ink aria-pressed:text-paper';
