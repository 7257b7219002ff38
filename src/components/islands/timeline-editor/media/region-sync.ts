/**
 * Keeps the waveform's regions in line with the timeline and shows the selection on them.
 * A plain object (not React state): regions are DOM owned by wavesurfer.js.
 */
import type RegionsPlugin from 'wavesurfer.js/dist/plugins/regions.esm.js';
import type { Region } from 'wavesurfer.js/dist/plugins/regions.esm.js';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import type { Selection } from '~/lib/editor/editor-state';
import { KIND_COLOURS, withAlpha } from '~/lib/editor/segment-style';
import { CUE_PREFIX, MINT, labelElement, pinElement, segmentLabel, styleSegmentElement } from './region-elements';

type Regions = ReturnType<typeof RegionsPlugin.create>;

export interface RegionSync {
  /** Adds, updates and removes regions by id; `force` resets positions the user dragged. */
  sync(regions: Regions, timeline: Timeline, selection: Selection, force?: boolean): void;
  showSelection(selection: Selection): void;
  clear(): void;
}

export function createRegionSync(): RegionSync {
  const byId = new Map<string, { region: Region; key: string }>();
  let selectedId: string | null = null;

  function showSelection(selection: Selection) {
    const id = selection ? (selection.type === 'cue' ? CUE_PREFIX + selection.id : selection.id) : null;
    const previous = selectedId ? byId.get(selectedId)?.region.element : null;
    if (previous) {
      previous.style.outline = '';
      previous.style.boxShadow = '';
      previous.style.zIndex = '';
    }
    selectedId = id;
    const el = id ? byId.get(id)?.region.element : null;
    if (!el || !selection) return;
    el.style.outline = '2px solid #172033';
    el.style.outlineOffset = '-1px';
    el.style.zIndex = '3';
    if (selection.type === 'segment' && selection.edge) {
      // The selected boundary gets a thick bar on its side.
      el.style.boxShadow = selection.edge === 'start' ? 'inset 5px 0 0 #172033' : 'inset -5px 0 0 #172033';
    }
  }

  function sync(regions: Regions, timeline: Timeline, selection: Selection, force = false) {
    const seen = new Set<string>();
    for (const s of timeline.segments) {
      seen.add(s.id);
      const key = `${s.kind}|${s.exercise ?? ''}|${s.round ?? ''}|${s.set ?? ''}`;
      const entry = byId.get(s.id);
      if (!entry) {
        const region = regions.addRegion({
          id: s.id,
          start: s.startSeconds,
          end: s.endSeconds,
          color: withAlpha(KIND_COLOURS[s.kind], 0.5),
          // The body drags the whole segment; the edges resize it.
          drag: true,
          resize: true,
          minLength: 0.1,
          content: labelElement(segmentLabel(s)),
        });
        styleSegmentElement(region, s);
        byId.set(s.id, { region, key });
        continue;
      }
      const { region } = entry;
      if (entry.key !== key) {
        region.setOptions({ color: withAlpha(KIND_COLOURS[s.kind], 0.5), content: labelElement(segmentLabel(s)) });
        styleSegmentElement(region, s);
        entry.key = key;
      }
      if (force || region.start !== s.startSeconds || region.end !== s.endSeconds) {
        region.setOptions({ start: s.startSeconds, end: s.endSeconds });
      }
    }
    for (const c of timeline.cues) {
      const id = CUE_PREFIX + c.id;
      seen.add(id);
      const entry = byId.get(id);
      if (!entry) {
        const region = regions.addRegion({ id, start: c.atSeconds, color: MINT, drag: true, resize: false, content: pinElement() });
        if (region.element) {
          region.element.title = `${c.kind} cue: ${c.text}`;
          region.element.style.borderLeft = `2px solid ${MINT}`;
        }
        byId.set(id, { region, key: c.text });
      } else if (force || entry.region.start !== c.atSeconds) {
        entry.region.setOptions({ start: c.atSeconds });
        if (entry.region.element) entry.region.element.title = `${c.kind} cue: ${c.text}`;
      }
    }
    for (const [id, entry] of byId) {
      if (!seen.has(id)) {
        entry.region.remove();
        byId.delete(id);
      }
    }
    showSelection(selection);
  }

  return {
    sync,
    showSelection,
    clear() {
      byId.clear();
      selectedId = null;
    },
  };
}
