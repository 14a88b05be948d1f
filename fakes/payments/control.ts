// `/_fake/*`: switches and shortcuts for tests and the demo (no API key; the fake listens on loopback).
import { z } from 'zod';
import { parse, type Route } from './api';
import type { Ctx } from './context';
import { ApiError } from './errors';
import { sweepPayouts } from './ledger';
import { intString } from './params';
import { paySession } from './payment';
import type { Chaos, Delivery } from './state';
import type { WebhookDispatcher, WebhookTarget } from './webhooks';

export type ControlDeps = { dispatcher: WebhookDispatcher; target: WebhookTarget; reset(): void };

const flexibleInt = z.union([z.number().int(), intString]);
const flexibleBool = z.union([z.boolean(), z.enum(['true', 'false']).transform((v) => v === 'true')]);

export const chaosParams = z
  .object({
    duplicate: flexibleInt.refine((n) => n >= 1 && n <= 20, 'Must be between 1 and 20'),
    shuffle: flexibleBool,
  })
  .partial()
  .strict();

export function applyChaos(ctx: Ctx, input: unknown): Chaos {
  const p = parse(chaosParams, input);
  ctx.state.chaos = { ...ctx.state.chaos, ...p };
  return ctx.state.chaos;
}

export function describeDelivery(ctx: Ctx, d: Delivery) {
  return {
    id: d.id,
    event_id: d.eventId,
    event_type: ctx.state.events[d.eventId]?.type ?? null,
    copy: d.copy,
    status: d.status,
    attempts: d.attempts,
    last_status: d.lastStatus,
    last_error: d.lastError,
    next_attempt_at: d.status === 'pending' ? new Date(d.nextAttemptAt).toISOString() : null,
    delivered_at: d.deliveredAt ? new Date(d.deliveredAt).toISOString() : null,
  };
}

export function controlRoutes(deps: ControlDeps): Route[] {
  return [
    {
      method: 'GET',
      pattern: /^\/_fake\/health$/,
      handle: (ctx) => ({
        ok: true,
        now: ctx.now(),
        webhook_url: deps.target.url,
        chaos: ctx.state.chaos,
        counts: {
          checkout_sessions: Object.keys(ctx.state.sessions).length,
          events: Object.keys(ctx.state.events).length,
          pending_deliveries: ctx.state.deliveries.filter((d) => d.status === 'pending').length,
        },
      }),
    },
    {
      method: 'POST',
      pattern: /^\/_fake\/reset$/,
      handle: () => {
        deps.reset();
        return { ok: true };
      },
    },
    { method: 'GET', pattern: /^\/_fake\/chaos$/, handle: (ctx) => ctx.state.chaos },
    { method: 'POST', pattern: /^\/_fake\/chaos$/, handle: (ctx, params) => applyChaos(ctx, params) },
    {
      method: 'POST',
      pattern: /^\/_fake\/sessions\/([^/]+)\/pay$/,
      handle: (ctx, params, [, id]) => {
        const { card } = parse(z.object({ card: z.string().min(1) }).strict(), params);
        const result = paySession(ctx, id, card);
        if (result.outcome === 'paid') return result;
        // A decline answers like the real API's card errors: 402 with the payment intent attached.
        throw new ApiError(402, 'card_error', result.message, 'card_declined', null, {
          decline_code: result.decline_code,
          payment_intent: result.payment_intent,
          charge: result.charge.id,
        });
      },
    },
    {
      method: 'POST',
      pattern: /^\/_fake\/payouts$/,
      handle: (ctx, params) => {
        const { currency } = parse(
          z
            .object({
              currency: z
                .string()
                .regex(/^[A-Za-z]{3}$/)
                .optional(),
            })
            .strict(),
          params,
        );
        return { object: 'list', data: sweepPayouts(ctx, currency), has_more: false, url: '/_fake/payouts' };
      },
    },
    {
      method: 'GET',
      pattern: /^\/_fake\/deliveries$/,
      handle: (ctx, params) => {
        const { event } = parse(z.object({ event: z.string().optional() }).strict(), params);
        const data = ctx.state.deliveries
          .filter((d) => !event || d.eventId === event)
          .map((d) => describeDelivery(ctx, d));
        return { object: 'list', data, has_more: false, url: '/_fake/deliveries' };
      },
    },
    {
      method: 'POST',
      pattern: /^\/_fake\/deliveries\/flush$/,
      handle: (ctx) => {
        deps.dispatcher.flush();
        return { pending: ctx.state.deliveries.filter((d) => d.status === 'pending').length };
      },
    },
    {
      method: 'POST',
      pattern: /^\/_fake\/webhook$/,
      handle: (_ctx, params) => {
        const p = parse(
          z.object({ url: z.union([z.url(), z.literal('')]), secret: z.string().min(1).optional() }).strict(),
          params,
        );
        deps.target.url = p.url || null;
        if (p.secret) deps.target.secret = p.secret;
        return { url: deps.target.url };
      },
    },
    {
      method: 'GET',
      pattern: /^\/_fake\/clock$/,
      handle: (ctx) => ({ now: ctx.now(), offset_seconds: ctx.state.clockOffsetSeconds }),
    },
    {
      method: 'POST',
      pattern: /^\/_fake\/clock$/,
      handle: (ctx, params) => {
        // Moves the fake's clock (object timestamps, expiry); webhook signatures keep real time.
        const p = parse(z.object({ advance: flexibleInt, now: flexibleInt }).partial().strict(), params);
        if (p.now !== undefined) ctx.state.clockOffsetSeconds += p.now - ctx.now();
        if (p.advance !== undefined) ctx.state.clockOffsetSeconds += p.advance;
        return { now: ctx.now(), offset_seconds: ctx.state.clockOffsetSeconds };
      },
    },
  ];
}
