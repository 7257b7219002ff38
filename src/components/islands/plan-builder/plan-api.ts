/** The plan builder's calls to our API (same origin, session cookie). */
import { planSchema, type Plan, type PlanInput } from '~/lib/plan/plan-schema';
import type { ExerciseListOutput } from '~/lib/api/exercise-schemas';
import type { LessonListOutput } from '~/lib/api/lesson-schemas';
import type { PlanTemplateOutput } from '~/lib/api/plan-template-schemas';
import type { RecordingListOutput } from '~/lib/api/recording-schemas';
import type { PlanViewOutput } from '~/lib/api/timeline-schemas';
import { apiCall, ApiError } from '../api-client';
import { pickRecording } from '../timeline-editor/editor-api';

const lessonPath = (id: string) => `/api/lessons/${encodeURIComponent(id)}`;

export interface PlanBuilderData {
  plan: Plan | null;
  version: number;
  exercises: string[];
  /** Length of the class's ready recording, if any. */
  recordingSeconds: number | null;
}

export async function loadPlanBuilder(lessonId: string): Promise<PlanBuilderData> {
  const [view, library, recs] = await Promise.all([
    apiCall<PlanViewOutput>('GET', `${lessonPath(lessonId)}/plan`),
    apiCall<ExerciseListOutput>('GET', '/api/exercises'),
    apiCall<RecordingListOutput>('GET', `${lessonPath(lessonId)}/recordings`),
  ]);
  const parsed = view.plan ? planSchema.safeParse(view.plan) : null;
  return {
    plan: parsed?.success ? parsed.data : null,
    version: view.version,
    exercises: library.exercises.map((e) => e.name),
    recordingSeconds: pickRecording(recs.recordings)?.durationSeconds ?? null,
  };
}

export type PlanSaveOutcome =
  | { ok: true; version: number; plan: Plan; addedExercises: string[] }
  | { ok: false; conflict: true }
  | { ok: false; conflict: false; message: string; fields: Record<string, string> };

/** Saves against `version`; a 409 and field errors come back as outcomes, never thrown. */
export async function savePlan(lessonId: string, version: number, plan: PlanInput): Promise<PlanSaveOutcome> {
  try {
    const res = await apiCall<PlanViewOutput & { plan: Plan }>('PUT', `${lessonPath(lessonId)}/plan`, { version, ...plan });
    return { ok: true, version: res.version, plan: res.plan, addedExercises: res.addedExercises ?? [] };
  } catch (err) {
    if (err instanceof ApiError && err.status === 409) return { ok: false, conflict: true };
    if (err instanceof ApiError && err.status === 400) return { ok: false, conflict: false, message: err.message, fields: err.fields ?? {} };
    throw err;
  }
}

/** A template as the API answers it; its plan is a plan input (built-in ones leave names to fill in). */
export type TemplateChoice = Omit<PlanTemplateOutput, 'plan'> & { plan: PlanInput };

export interface TemplateSources {
  templates: TemplateChoice[];
  /** The studio's other classes, to copy a plan from. */
  classes: { id: string; title: string }[];
}

export async function loadTemplateSources(lessonId: string): Promise<TemplateSources> {
  const [t, l] = await Promise.all([
    apiCall<{ templates: TemplateChoice[] }>('GET', '/api/plan-templates'),
    apiCall<LessonListOutput>('GET', '/api/lessons'),
  ]);
  return { templates: t.templates, classes: l.lessons.filter((x) => x.id !== lessonId).map((x) => ({ id: x.id, title: x.title })) };
}

/** Another class's plan, or null when it has none. */
export async function loadClassPlan(lessonId: string): Promise<Plan | null> {
  const view = await apiCall<PlanViewOutput>('GET', `${lessonPath(lessonId)}/plan`);
  const parsed = view.plan ? planSchema.safeParse(view.plan) : null;
  return parsed?.success ? parsed.data : null;
}

export async function saveTemplate(name: string, plan: PlanInput): Promise<TemplateChoice> {
  return apiCall<TemplateChoice>('POST', '/api/plan-templates', { name, plan });
}
