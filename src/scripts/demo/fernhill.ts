/**
 * The invented demo scenario (../shared/design.md): Fernhill Movement Co. and its people.
 * Demo data only: nothing here is a check value for tests.
 */
import type { ChangeSignal } from '~/lib/media/class-soundtrack';
import { evenStations } from '~/lib/plan/even-stations';

export const DEMO_PASSWORD = 'fernhill-demo-2026';

// design.md names no zone; the studio prices in euros and the scheduling story is a Berlin coach.
export const studio = { slug: 'fernhill', name: 'Fernhill Movement Co.', timeZone: 'Europe/Berlin', locale: 'en-GB' };

export const people = [
  { email: 'ada@fernhill.example', name: 'Ada Okafor', roles: ['owner', 'coach'] },
  { email: 'tomasz@fernhill.example', name: 'Tomasz Wren', roles: ['coach'] },
  { email: 'priya@fernhill.example', name: 'Priya Sandoval', roles: ['editor'] },
  { email: 'sam@fernhill.example', name: 'Sam Rivera', roles: ['member'] },
  { email: 'lee@fernhill.example', name: 'Lee Haddad', roles: ['member'] },
  { email: 'noor@fernhill.example', name: 'Noor Castell', roles: ['member'] },
] as const;

export const exercises = [
  { name: 'Goblet squat', focus: 'lower body', equipment: ['dumbbell'], cautions: 'Keep knees tracking over toes; stop if your knees or lower back hurt.', easierOption: 'Bodyweight squat to a chair', harderOption: 'Pause for two counts at the bottom' },
  { name: 'Bent-over row', focus: 'upper body', equipment: ['dumbbells'], cautions: 'Hinge from the hips with a long spine; do not round the lower back.', easierOption: 'One arm at a time with a hand on a bench', harderOption: 'Slow three-count lowering' },
  { name: 'Reverse lunge', focus: 'lower body', equipment: [], cautions: 'Step back only as far as you can control; hold a wall for balance if needed.', easierOption: 'Shorter step, hand on a wall', harderOption: 'Hold dumbbells at your sides' },
  { name: 'Push-up', focus: 'upper body', equipment: ['mat'], cautions: 'Keep a straight line from head to heels; stop on wrist or shoulder pain.', easierOption: 'Hands on a bench or knees down', harderOption: 'Feet raised on a step' },
  { name: 'Dead bug', focus: 'core', equipment: ['mat'], cautions: 'Keep your lower back in contact with the mat.', easierOption: 'Move only the legs', harderOption: 'Hold a light dumbbell overhead' },
  { name: 'Fast feet', focus: 'cardio', equipment: [], cautions: 'High impact: land softly; march in place if jumping hurts.', easierOption: 'Quick march', harderOption: 'Add a squat drop every 5 s' },
  { name: 'Squat jump', focus: 'cardio', equipment: [], cautions: 'High impact: land softly with bent knees.', easierOption: 'Squat with a heel raise', harderOption: 'Tuck jump' },
  { name: 'Cat-cow', focus: 'mobility', equipment: ['mat'], cautions: 'Move within a pain-free range.', easierOption: 'Seated version on a chair', harderOption: 'Add a thread-the-needle reach' },
  { name: 'Thoracic rotation', focus: 'mobility', equipment: [], cautions: 'Turn from the upper back, not the lower back.', easierOption: 'Seated rotation', harderOption: 'Half-kneeling rotation' },
  { name: 'Hip flexor stretch', focus: 'mobility', equipment: ['mat'], cautions: 'Pad the knee; ease off if you feel pinching at the hip.', easierOption: 'Standing version holding a chair', harderOption: 'Add an overhead reach' },
  { name: 'Shoulder circles', focus: 'mobility', equipment: [], cautions: 'Small circles first; stop if the shoulder clicks painfully.', easierOption: 'One arm at a time', harderOption: 'Hold light weights' },
  { name: 'Neck release', focus: 'mobility', equipment: [], cautions: 'Slow and gentle; no circles if you feel dizzy.', easierOption: 'Smaller range', harderOption: 'Add a gentle hand assist' },
  { name: 'Mountain climber', focus: 'core', equipment: ['mat'], cautions: 'Keep hips low; slow down if the wrists complain.', easierOption: 'Step the feet in one at a time', harderOption: 'Cross the knee to the opposite elbow' },
  { name: 'High knees', focus: 'cardio', equipment: [], cautions: 'High impact: land on the balls of the feet softly.', easierOption: 'Knee lifts without a hop', harderOption: 'Faster tempo' },
] as const;

type Block = Record<string, unknown>;
export interface DemoLesson {
  slug: string;
  title: string;
  coach: string;
  description: string;
  advertisedMinutes: number;
  equipment: string[];
  impact: 'low' | 'moderate' | 'high';
  focus: string[];
  difficulty: 'beginner' | 'intermediate' | 'advanced';
  cautions: string;
  state: 'draft' | 'published';
  /** How the coach marks the changes in the demo recording's soundtrack. */
  changeSignal: ChangeSignal;
  plan: { blocks: Block[]; options?: Record<string, boolean> };
  /** Seeded with demo captions (demo-captions.ts) that publish with the class. */
  captioned?: boolean;
}

export const lessons: DemoLesson[] = [
  {
    slug: 'lunch-hour-ladder',
    title: 'Lunch-hour Ladder',
    coach: 'ada@fernhill.example',
    description: 'A full-body strength circuit that fits a lunch break: five moves, four rounds, dumbbells and a mat.',
    advertisedMinutes: 30,
    equipment: ['dumbbells', 'mat'],
    impact: 'low',
    focus: ['full body'],
    difficulty: 'intermediate',
    cautions: 'Choose a weight you can lift for 40 seconds with good form.',
    state: 'published',
    changeSignal: 'beeps',
    plan: {
      blocks: [
        { kind: 'warmup', seconds: 240 },
        {
          kind: 'circuit',
          rounds: 4,
          roundBreakSeconds: 60,
          stations: evenStations(['Goblet squat', 'Bent-over row', 'Reverse lunge', 'Push-up', 'Dead bug'], 40, 20),
        },
        { kind: 'cooldown', seconds: 180 },
      ],
      options: { roundBreakReplacesLastRest: true, dropFinalRest: true },
    },
  },
  {
    slug: 'twenty-ten-finisher',
    title: 'Twenty-Ten Finisher',
    coach: 'tomasz@fernhill.example',
    description: 'Two short blocks of twenty seconds hard, ten seconds easy. No equipment, lots of sweat.',
    advertisedMinutes: 10,
    equipment: [],
    impact: 'high',
    focus: ['cardio'],
    difficulty: 'advanced',
    cautions: 'High impact throughout: take the low-impact option whenever you need it.',
    state: 'published',
    changeSignal: 'beeps',
    plan: {
      blocks: [
        { kind: 'intervals', exercise: 'Fast feet', sets: 8, workSeconds: 20, restSeconds: 10 },
        { kind: 'talk', seconds: 60 },
        { kind: 'intervals', exercise: 'Squat jump', sets: 8, workSeconds: 20, restSeconds: 10 },
      ],
      options: { roundBreakReplacesLastRest: true, dropFinalRest: false },
    },
  },
  {
    slug: 'desk-break-mobility',
    title: 'Desk-Break Mobility',
    coach: 'ada@fernhill.example',
    description: 'Loosen the neck, shoulders, back and hips in ten quiet minutes. No equipment needed.',
    advertisedMinutes: 10,
    equipment: [],
    impact: 'low',
    focus: ['mobility'],
    difficulty: 'beginner',
    cautions: '',
    state: 'published',
    changeSignal: 'count',
    captioned: true,
    plan: {
      blocks: [
        {
          kind: 'circuit',
          rounds: 2,
          roundBreakSeconds: 0,
          stations: evenStations(['Neck release', 'Shoulder circles', 'Cat-cow', 'Thoracic rotation', 'Hip flexor stretch', 'Reverse lunge'], 30, 10),
        },
      ],
      options: { roundBreakReplacesLastRest: false, dropFinalRest: true },
    },
  },
  {
    slug: 'hill-sprints-prep',
    title: 'Hill Sprints Prep',
    coach: 'tomasz@fernhill.example',
    description: 'Leg power and core work to get ready for the hill sprint season.',
    advertisedMinutes: 25,
    equipment: ['mat'],
    impact: 'high',
    focus: ['lower body', 'core'],
    difficulty: 'intermediate',
    cautions: 'Warm up fully before the jumps.',
    state: 'draft',
    changeSignal: 'whistle',
    plan: {
      blocks: [
        { kind: 'warmup', seconds: 240 },
        {
          kind: 'circuit',
          rounds: 3,
          roundBreakSeconds: 60,
          stations: evenStations(['Squat jump', 'Mountain climber', 'Reverse lunge', 'High knees'], 40, 20),
        },
        { kind: 'cooldown', seconds: 180 },
      ],
      options: { roundBreakReplacesLastRest: true, dropFinalRest: true },
    },
  },
];
