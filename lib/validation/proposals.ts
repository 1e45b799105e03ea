import { z } from 'zod';
import { SETTINGS } from './trials';

export const VERDICTS = ['feed', 'limit', 'prepare', 'avoid', 'unsettled'] as const;

/** One setting of a proposed published verdict. */
export const ProposedSettingSchema = z.object({
  setting: z.enum(SETTINGS, { message: 'Choose a setting.' }),
  verdict: z.enum(VERDICTS, { message: 'Choose a verdict.' }),
  ceilingKgM2: z.coerce.number().finite().positive('A ceiling must be more than zero.').max(1_000).nullish().transform((v) => v ?? null),
  cautions: z.array(z.string().trim().min(2).max(200)).max(20).default([]),
});

export const ProposalCreateSchema = z
  .object({
    feedstockId: z.coerce.number().int().positive(),
    settings: z.array(ProposedSettingSchema).min(1, 'Propose a verdict for at least one setting.').max(3),
    rationale: z.string().trim().min(20, 'Explain the change in a few sentences (at least 20 characters).').max(5_000),
    trialIds: z.array(z.coerce.number().int().positive()).max(200).default([]),
  })
  .refine((p) => new Set(p.settings.map((s) => s.setting)).size === p.settings.length, {
    message: 'Each setting can appear only once.',
    path: ['settings'],
  });
export type ProposalCreateInput = z.infer<typeof ProposalCreateSchema>;

export const VoteSchema = z.object({
  agree: z.coerce.boolean(),
  reason: z.string().trim().min(3, 'Give a short reason, ideally pointing at a trial.').max(500),
});
export type VoteInput = z.infer<typeof VoteSchema>;

export const DecisionSchema = z.object({
  decision: z.enum(['approve', 'reject'], { message: 'Approve or reject.' }),
  note: z.string().trim().min(5, 'Write a note for the author and the history (at least 5 characters).').max(5_000),
});
export type DecisionInput = z.infer<typeof DecisionSchema>;

export const HideSchema = z.object({
  hidden: z.coerce.boolean(),
  reason: z.string().trim().min(3, 'Say why.').max(500),
});
