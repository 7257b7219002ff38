import type { TimelineSave } from './controller/use-timeline-save';
import { toolButton } from './tool-button';
import { formatInstant } from '~/lib/time/date-format';
import { useStudioClock } from '../studio-clock-context';

/** Offers the marks this device kept but never saved. */
export default function DraftOffer({ saving, serverVersion }: { saving: TimelineSave; serverVersion: number }) {
  const draft = saving.draftOffer;
  const clock = useStudioClock();
  if (!draft) return null;
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-[10px] border border-info/40 bg-info/10 p-3" role="region" aria-label="Unsaved draft">
      <p className="text-sm">
        This device kept marks you had not saved ({formatInstant(draft.savedAt, clock, 'dateTime')}).
        {draft.baseVersion !== serverVersion && ' Someone has saved since; when you save, you will see what differs.'}
      </p>
      <button type="button" className={toolButton} onClick={saving.restoreDraft}>Bring them back</button>
      <button type="button" className={toolButton} onClick={saving.discardDraft}>Discard them</button>
    </div>
  );
}
