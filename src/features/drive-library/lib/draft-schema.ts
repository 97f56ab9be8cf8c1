/**
 * The engine editor's react-hook-form resolver: the draft is checked with the shared drive schema
 * (through `checkDraft`, the same checks the server makes) and each problem is placed at the form
 * field it belongs to, in the user's words.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { checkDraft, formPathOf, type EngineDraft, type PulleyOptions } from './draft';

/** A zod schema over the draft whose issues are the drive schema's, at form paths. */
export function engineDraftSchema(options: PulleyOptions) {
  return z.custom<EngineDraft>((v) => typeof v === 'object' && v !== null).superRefine((draft, ctx) => {
    const { errors } = checkDraft(draft, options);
    for (const [path, message] of Object.entries(errors)) {
      const segments = formPathOf(path, draft).split('.').map((s) => (/^\d+$/.test(s) ? Number(s) : s));
      ctx.addIssue({ code: 'custom', path: segments, message });
    }
  });
}

/** The resolver for `useForm<EngineDraft>`. */
export function engineDraftResolver(options: PulleyOptions) {
  return zodResolver(engineDraftSchema(options));
}
