import { z } from "zod";
import { plainText } from "@/lib/validation/text";

// The name a volunteer chooses to be published under (a real name or a pseudonym), shown as
// the recorder of their approved sightings in the open data (Darwin Core's recordedBy). It may
// not look like an e-mail address: an address is never published. Messages: MyData.errors.
export const PUBLISHED_NAME_MAX = 80;

export const publishedNameField = plainText(PUBLISHED_NAME_MAX)
  .trim()
  .min(1, { error: "required" })
  .refine((v) => !v.includes("@"), { error: "nameNotEmail" });

/** Consent to what is published must be given explicitly, every time a name is set. */
export const consentField = z.literal(true, { error: "consentRequired" });

export const publishedNameInput = z.object({ publishedName: publishedNameField, consent: consentField }).strict();
export type PublishedNameInput = z.infer<typeof publishedNameInput>;

/** Erasing the account: the person types their own e-mail address to confirm. */
export const eraseAccountInput = z.object({ confirm: z.string().max(254) }).strict();
