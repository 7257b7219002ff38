import './zod-without-eval'; // first: before any schema is built
import { useEffect, useRef } from 'react';
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip } from 'chart.js';
import type { ChapterInsight } from '~/lib/publishing/insights';

Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

/** Where members leave or skip, per chapter (Chart.js), with the same numbers in a table for screen readers. */
export default function DropOffChart({ chapters }: { chapters: ChapterInsight[] }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    if (!canvas.current) return;
    const chart = new Chart(canvas.current, {
      type: 'bar',
      data: {
        labels: chapters.map((c) => `${c.index + 1}. ${c.title}`),
        datasets: [
          { label: 'Stopped here', data: chapters.map((c) => c.left), backgroundColor: '#E4572E' },
          // An outline as well as a colour: the two series differ by more than hue.
          { label: 'Skipped', data: chapters.map((c) => c.skipped), backgroundColor: '#2E86AB', borderColor: '#172033', borderWidth: 1 },
        ],
      },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        scales: { y: { beginAtZero: true, ticks: { precision: 0 } }, x: { ticks: { autoSkip: false, maxRotation: 60 } } },
        plugins: { legend: { position: 'bottom' } },
      },
    });
    return () => chart.destroy();
  }, [chapters]);
  return (
    <figure>
      <div className="h-80">
        <canvas ref={canvas} role="img" aria-label="Members who stopped or skipped, per chapter (numbers in the table below)" />
      </div>
      <figcaption className="sr-only">Members who stopped or skipped, per chapter</figcaption>
    </figure>
  );
}
