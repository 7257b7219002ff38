import { commaList, createLessonInput, updateLessonInput } from '~/lib/api/lesson-schemas';
import { publishFormInput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { parseWith } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { createClass, updateClassDetails } from '~/server/use-cases/class-details';
import { publishClass } from '~/server/use-cases/publish-class';
import { schedulePublish } from '~/server/use-cases/schedule-publish';
import { archiveClass, unpublishClass } from '~/server/use-cases/withdraw-class';
import { formAction, formValues } from './form-action';

/** Form fields as text; equipment and focus are typed as comma lists. */
const detailsFrom = (v: Record<string, string>) => ({ ...v, equipment: commaList(v.equipment), focus: commaList(v.focus) });

export const classActions = {
  /** "Create a class" on the classes page. */
  createClass: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const v = formValues(form);
    const input = parseWith(createLessonInput, { ...detailsFrom(v), coachId: v.coachId || undefined });
    const lesson = await createClass(actor, app(), input);
    return { id: lesson.id };
  }),

  /** "Details" on a class page. */
  updateClassDetails: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const { lessonId = '', ...v } = formValues(form);
    const details = parseWith(updateLessonInput, { ...detailsFrom(v), version: Number(v.version) });
    return updateClassDetails(actor, app(), { lessonId, details });
  }),

  /** The publishing panel: publish now, schedule (owner), take out of the library, archive. */
  publishing: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    const input = parseWith(publishFormInput, formValues(form));
    const lessonId = input.lessonId;
    switch (input.intent) {
      case 'publish': {
        const v = await publishClass(actor, app(), { lessonId, acknowledgeWarnings: input.acknowledgeWarnings });
        return `Published as version ${v.number}. Members see it in the library now.`;
      }
      case 'schedule': {
        await schedulePublish(actor, app(), { lessonId, when: { wallClock: input.publishAt }, acknowledgeWarnings: input.acknowledgeWarnings });
        return 'Scheduled. The class goes live at that time if the check still has no errors.';
      }
      case 'unpublish':
        await unpublishClass(actor, app(), { lessonId });
        return 'Taken out of the library. Nothing was deleted.';
      case 'archive':
        await archiveClass(actor, app(), { lessonId });
        return 'Archived.';
    }
  }),
};
