import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { errors, json } from './responses';
import {
  createInvitationInput,
  forgotPasswordInput,
  forgotPasswordOutput,
  invitationListOutput,
  invitationOutput,
  resendVerificationOutput,
  resetPasswordInput,
} from '~/lib/api/mail-schemas';
import { invitationIdParams } from '~/lib/api/route-params';


/** API routes of the mail feature, described from their zod schemas. */
export const mailRoutes: RouteConfig[] = [
  {
    method: 'post', path: '/api/auth/verify-email/resend', summary: 'Send a new link to confirm the signed-in person’s e-mail address (at most 5 an hour)',
    responses: {
      202: json(resendVerificationOutput, 'A new link is on its way'),
      200: json(resendVerificationOutput, 'The address is already confirmed; nothing sent'),
      ...errors(401, 429),
    },
  },
  {
    method: 'post', path: '/api/auth/forgot-password', summary: 'Send a password reset link (valid 1 hour, once); answers the same whether or not the address has an account', security: [],
    request: { body: json(forgotPasswordInput, 'The account’s e-mail address') },
    responses: { 202: json(forgotPasswordOutput, 'Accepted'), ...errors(400, 429) },
  },
  {
    method: 'post', path: '/api/auth/reset-password', summary: 'Set a new password with a reset link’s token; signs out every session of the account', security: [],
    request: { body: json(resetPasswordInput, 'Token from the e-mailed link and the new password') },
    responses: { 204: { description: 'Password changed; sign in again' }, ...errors(400) },
  },
  {
    method: 'get', path: '/api/invitations', summary: 'Invitations not yet accepted, newest first (owner)',
    responses: { 200: json(invitationListOutput, 'Pending invitations'), ...errors(401, 403) },
  },
  {
    method: 'post', path: '/api/invitations', summary: 'Invite a coach or an editor by e-mail (owner); replaces a pending invitation to the same address; expires after 7 days',
    request: { body: json(createInvitationInput, 'Who and which role') },
    responses: { 201: json(invitationOutput, 'Invitation sent'), ...errors(400, 401, 403, 409, 503) },
  },
  {
    method: 'delete', path: '/api/invitations/{id}', summary: 'Withdraw a pending invitation (owner); its link stops working',
    request: { params: invitationIdParams },
    responses: { 204: { description: 'Withdrawn' }, ...errors(401, 403, 404) },
  },
];
