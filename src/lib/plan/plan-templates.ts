/**
 * Built-in plan templates: the class formats coaches start from most. Exercise names are left
 * empty on purpose: the plan builder asks for them at the field, so a class never goes out
 * with a placeholder move. Studios save their own templates next to these (database).
 */
import { z } from 'zod';
import { evenStations } from './even-stations';
import type { PlanInput } from './plan-schema';

export interface BuiltInTemplate {
  id: string;
  name: string;
  description: string;
  plan: PlanInput;
}


export const BUILT_IN_TEMPLATES: readonly BuiltInTemplate[] = [
  {
    id: 'tabata',
    name: 'Tabata 8 × 20/10 s',
    description: 'One move, 8 sets of 20 s work and 10 s rest: 4 minutes.',
    // Tabata I. et al., Med Sci Sports Exerc 1996;28(10):1327–1330: 8 × (20 s + 10 s) = 240 s,
    // the last rest included, so the template keeps the final rest.
    plan: { blocks: [{ kind: 'intervals', exercise: '', sets: 8, workSeconds: 20, restSeconds: 10 }], options: { dropFinalRest: false } },
  },
  {
    id: 'six-station-circuit',
    name: 'Six-station circuit 45/15 s × 3',
    description: 'Six stations of 45 s work and 15 s rest, three rounds: 18 minutes.',
    // 6 × (45 s + 15 s) × 3 = 18 min (common practice, no source): every rest kept, no round break.
    plan: {
      blocks: [{ kind: 'circuit', rounds: 3, roundBreakSeconds: 0, stations: evenStations(6, 45, 15) }],
      options: { roundBreakReplacesLastRest: false, dropFinalRest: false },
    },
  },
  {
    id: 'ladder',
    name: 'Ladder 30/40/50 s',
    description: 'Three stations, three rounds; work rises from 30 to 40 to 50 s with 20 s rests and a 60 s round break.',
    plan: {
      blocks: [
        {
          kind: 'circuit',
          rounds: 3,
          roundBreakSeconds: 60,
          stations: evenStations(3, 30, 20),
          roundChanges: [
            { round: 1, workSeconds: 30 },
            { round: 2, workSeconds: 40 },
            { round: 3, workSeconds: 50 },
          ],
        },
      ],
    },
  },
  {
    id: 'emom-10',
    name: 'EMOM 10 min',
    description: 'Every minute on the minute for 10 minutes: two moves take turns, about 40 s of work at the top of each minute, the rest of the minute to recover.',
    // EMOM as the trade defines it (common practice, no source): N minutes = N rounds = N × 60 s.
    plan: { blocks: [{ kind: 'emom', minutes: 10, workSeconds: 40, exercises: ['', ''] }] },
  },
  {
    id: 'amrap-12',
    name: 'AMRAP 12 min',
    description: 'As many rounds as possible of three moves in one 12-minute span.',
    // AMRAP as the trade defines it (common practice, no source): one timed span of 720 s.
    plan: { blocks: [{ kind: 'amrap', seconds: 720, exercises: ['', '', ''] }] },
  },
];

/** Saving the current plan as a studio template. */
export const templateNameSchema = z
  .string({ error: 'The template needs a name.' })
  .trim()
  .min(1, { error: 'The template needs a name.' })
  .max(120, { error: 'A template name can be at most 120 characters.' })
  .regex(/^[^\p{Cc}]*$/u, { error: 'A template name must be one line without control characters.' })
  .describe('Name of the template, unique in the studio.');
