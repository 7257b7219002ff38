import type { RouteConfig } from '@asteasolutions/zod-to-openapi';
import { errors, json } from './responses';
import {
  billingSettingsInput,
  billingSettingsOutput,
  checkoutInput,
  checkoutOutput,
  memberListOutput,
  membersCsvText,
  membershipOutput,
  membersQuery,
  onboardingLinkOutput,
  paymentAccountOutput,
  promoCreateInput,
  promoOutput,
  promoListOutput,
  promoPatchInput,
  webhookEventInput,
  webhookHeaders,
  webhookReceivedOutput,
} from '~/lib/api/billing-schemas';
import { promoCodeIdParams } from '~/lib/api/route-params';


/** API routes of the billing feature, described from their zod schemas. */
export const billingRoutes: RouteConfig[] = [
  {
    method: 'post',
    path: '/api/payments/webhook',
    summary: 'Signed events from the payment provider (Stripe-Signature header); each event id is applied once',
    security: [],
    request: {
      headers: webhookHeaders,
      body: { description: 'The event as the provider sent it', content: { 'application/json': { schema: webhookEventInput } } },
    },
    responses: {
      200: json(webhookReceivedOutput, 'Received (applied, or ignored as a repeat, older or unrelated event)'),
      ...errors(400),
    },
  },
  {
    method: 'post',
    path: '/api/billing/checkout',
    summary: 'Open the hosted payment page for the membership (member); trial for first-timers, optional promo code',
    request: { body: json(checkoutInput, 'Optional promo code') },
    responses: { 200: json(checkoutOutput, 'Send the member to this URL'), ...errors(400, 401, 403, 409, 503) },
  },
  {
    method: 'get',
    path: '/api/billing/membership',
    summary: 'The signed-in member’s membership',
    responses: { 200: json(membershipOutput, 'Membership'), ...errors(401, 403) },
  },
  {
    method: 'post',
    path: '/api/billing/cancel',
    summary: 'Cancel at the end of the current period or trial (member)',
    responses: { 200: json(membershipOutput, 'Membership'), ...errors(401, 403, 409, 503) },
  },
  {
    method: 'post',
    path: '/api/billing/resume',
    summary: 'Take back a cancellation before the period ends (member)',
    responses: { 200: json(membershipOutput, 'Membership'), ...errors(401, 403, 409, 503) },
  },
  {
    method: 'get',
    path: '/api/billing/settings',
    summary: 'Monthly price, trial length and past-due grace (owner)',
    responses: { 200: json(billingSettingsOutput, 'Settings'), ...errors(401, 403) },
  },
  {
    method: 'put',
    path: '/api/billing/settings',
    summary: 'Change price, trial or grace (owner); send the version you read',
    request: { body: json(billingSettingsInput, 'Settings') },
    responses: { 200: json(billingSettingsOutput, 'Saved'), ...errors(400, 401, 403, 409, 503) },
  },
  {
    method: 'get',
    path: '/api/billing/payments',
    summary: 'The studio’s own payment account and its state, read from the provider (owner)',
    responses: { 200: json(paymentAccountOutput, 'Payment account'), ...errors(401, 403) },
  },
  {
    method: 'post',
    path: '/api/billing/payments/onboarding',
    summary: 'Connect the studio’s payment account or continue its setup (owner): answers the provider’s onboarding page',
    responses: { 200: json(onboardingLinkOutput, 'Send the owner to this URL'), ...errors(401, 403, 503) },
  },
  {
    method: 'get',
    path: '/api/billing/promo-codes',
    summary: 'Promo codes with their redemptions (owner)',
    responses: { 200: json(promoListOutput, 'Promo codes'), ...errors(401, 403) },
  },
  {
    method: 'post',
    path: '/api/billing/promo-codes',
    summary: 'Create a percent-off-the-first-month promo code (owner)',
    request: { body: json(promoCreateInput, 'Code') },
    responses: { 201: json(promoOutput, 'Created'), ...errors(400, 401, 403, 409, 503) },
  },
  {
    method: 'patch',
    path: '/api/billing/promo-codes/{id}',
    summary: 'Deactivate or reactivate a promo code (owner)',
    request: { params: promoCodeIdParams, body: json(promoPatchInput, 'Active or not') },
    responses: { 200: json(promoOutput, 'Updated'), ...errors(400, 401, 403, 404, 503) },
  },
  {
    method: 'get',
    path: '/api/billing/members',
    summary: 'Members with their membership status (owner); format=csv downloads the same table',
    request: {
      query: membersQuery,
    },
    responses: {
      200: {
        description: 'Members (JSON) or a CSV file',
        content: { 'application/json': { schema: memberListOutput }, 'text/csv': { schema: membersCsvText } },
      },
      ...errors(400, 401, 403),
    },
  },
];
