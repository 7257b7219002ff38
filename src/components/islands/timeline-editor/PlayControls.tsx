import { formatEditorTime } from '~/lib/time/format-time';
import { usePlayheadTenths, usePlaying, type PlayheadStore } from './playhead-store';
import { toolButton } from './tool-button';

export function PlayheadTime({ store, total }: { store: PlayheadStore; total: number }) {
  const t = usePlayheadTenths(store);
  return (
    <span className="tabular rounded-[10px] bg-ink px-3 py-2 text-sm font-bold text-paper" aria-live="off" data-playhead>
      {formatEditorTime(t)} <span className="font-normal text-stone">/ {formatEditorTime(total)}</span>
    </span>
  );
}

export function PlayButton({ store, disabled, onClick }: { store: PlayheadStore; disabled: boolean; onClick(): void }) {
  const playing = usePlaying(store);
  return (
    <button type="button" className={toolButton} onClick={onClick} disabled={disabled} aria-keyshortcuts="Space K" data-play>
      <span aria-hidden="true">{playing ? '❚❚' : '▶'}</span> {playing ? 'Pause' : 'Play'}
    </button>
  );
}
