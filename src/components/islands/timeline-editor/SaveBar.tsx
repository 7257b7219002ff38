import type { TimelineSave } from './controller/use-timeline-save';

/** Where the marks stand (saved, unsaved, saving, conflict) and the save button. */
export default function SaveBar({ saving }: { saving: TimelineSave }) {
  const { saveState, dirty, label } = saving;
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-[10px] bg-paper p-3">
      <p className="text-sm font-semibold" role="status" data-save-state={saveState.status} data-dirty={dirty ? 'true' : 'false'}>{label}</p>
      {saveState.status === 'error' && <p role="alert" className="text-sm font-semibold text-error">{saveState.message}</p>}
      <button
        type="button"
        onClick={() => void saving.save()}
        disabled={saveState.status === 'saving' || (!dirty && saveState.status !== 'error')}
        className="ml-auto rounded-[10px] bg-ink px-4 py-2 font-bold text-paper disabled:opacity-50"
        aria-keyshortcuts="Control+S"
      >
        Save timeline
      </button>
    </div>
  );
}
