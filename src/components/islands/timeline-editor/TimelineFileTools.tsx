import { useId, useState } from 'react';
import { timelineToCsv } from '~/lib/timeline/timeline-csv';
import { timelineToWebVtt } from '~/lib/timeline/timeline-webvtt';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { importPreview, importRefusal, readTimelineFile, type ImportPreview } from '~/lib/editor/timeline-file';
import type { EditorView } from './controller/use-editor-controller';
import { toolButton } from './tool-button';

function download(name: string, type: string, text: string) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/**
 * Export the marks on screen as CSV or WebVTT chapters, and import a file: a preview says what
 * would change before the marks are replaced, and Undo brings the old marks back.
 */
export default function TimelineFileTools({ c, fileName }: { c: EditorView; fileName: string }) {
  const inputId = useId();
  const [pending, setPending] = useState<{ timeline: Timeline; preview: ImportPreview; name: string } | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const exportVtt = () => {
    const out = timelineToWebVtt(c.state.timeline);
    if (out.ok) download(`${fileName}.vtt`, 'text/vtt', out.text);
    else setProblem(`The chapters cannot be written: ${out.errors[0]?.message ?? 'some marks overlap.'}`);
  };
  const onFile = async (file: File | undefined) => {
    setProblem(null);
    setPending(null);
    if (!file) return;
    const result = readTimelineFile(await file.text());
    if (!result.ok) return setProblem(importRefusal(result.errors));
    setPending({ timeline: result.timeline, preview: importPreview(c.state.timeline, result.timeline), name: file.name });
  };
  const replace = () => {
    if (!pending) return;
    c.dispatch({ type: 'replace', timeline: pending.timeline, keepHistory: true, notice: `Marks replaced from ${pending.name}. Undo brings the earlier marks back; save to keep them.` });
    setPending(null);
  };

  return (
    <div className="flex flex-col gap-2" data-file-tools>
      <div className="flex flex-wrap items-center gap-2">
        <button type="button" className={toolButton} onClick={() => download(`${fileName}.csv`, 'text/csv', timelineToCsv(c.state.timeline))}>Export CSV</button>
        <button type="button" className={toolButton} onClick={exportVtt}>Export WebVTT</button>
        <label htmlFor={inputId} className={`${toolButton} cursor-pointer`}>Import a file…</label>
        <input
          id={inputId}
          type="file"
          accept=".csv,.vtt,text/csv,text/vtt"
          className="sr-only"
          onChange={(e) => {
            void onFile(e.target.files?.[0]);
            e.target.value = '';
          }}
          data-import-input
        />
      </div>
      {problem && <p role="alert" className="text-sm font-semibold text-error" data-import-problem>{problem}</p>}
      {pending && (
        <div className="flex flex-wrap items-center gap-3 rounded-[10px] border border-info/40 bg-info/10 p-3" role="region" aria-label="Import preview" data-import-preview>
          <p className="text-sm">
            <span className="font-semibold">{pending.name}</span> holds {pending.preview.segments} segments and {pending.preview.cues} cues. Replacing the marks with it:{' '}
            <span className="tabular" data-import-counts>
              {pending.preview.added} added, {pending.preview.removed} removed, {pending.preview.moved} moved or changed
            </span>
            .
          </p>
          <button type="button" className={toolButton} onClick={replace}>Replace the marks</button>
          <button type="button" className={toolButton} onClick={() => setPending(null)}>Cancel</button>
        </div>
      )}
    </div>
  );
}
