import { classActions } from './class-actions';
import { accountActions } from './account-actions';
import { membershipActions } from './membership-actions';
import { studioActions } from './studio-actions';
import { studioEntryActions } from './studio-entry-actions';
import { entryActions } from './entry-actions';

/** Every form door of the app; each calls one use case (see docs/decisions/0001-form-doors.md). */
export const server = {
  ...classActions,
  ...studioActions,
  ...studioEntryActions,
  ...membershipActions,
  ...accountActions,
  ...entryActions,
};
