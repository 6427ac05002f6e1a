import { z } from 'zod';

/** Which e-mails a person wants; every kind is on until they turn it off. */
export const MailPreferencesSchema = z.object({
  /** Someone asks you to review a version. */
  reviewRequests: z.boolean(),
  /** A reviewer asks for changes or signs off on a review you asked for or of a notebook you edit. */
  reviewDecisions: z.boolean(),
  /** Someone replies in a pin thread you are in. */
  pinReplies: z.boolean(),
  /** You are given a role in a notebook. */
  addedToNotebook: z.boolean(),
});
export type MailPreferences = z.infer<typeof MailPreferencesSchema>;
export type MailKind = keyof MailPreferences;

/** `GET /api/me/settings` (and the answer to a PATCH). */
export const SettingsSchema = z.object({ mail: MailPreferencesSchema });
export type Settings = z.infer<typeof SettingsSchema>;

/** `PATCH /api/me/settings`: change any of the mail preferences; the rest stay as they are. */
export const SettingsUpdateSchema = z.strictObject({
  mail: z
    .strictObject({
      reviewRequests: z.boolean().optional(),
      reviewDecisions: z.boolean().optional(),
      pinReplies: z.boolean().optional(),
      addedToNotebook: z.boolean().optional(),
    })
    .refine((mail) => Object.keys(mail).length > 0, { message: 'Send at least one of reviewRequests, reviewDecisions, pinReplies, addedToNotebook.' }),
});
export type SettingsUpdate = z.infer<typeof SettingsUpdateSchema>;
