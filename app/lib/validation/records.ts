import { z } from "zod";

/** One surveyor to issue a record to; the name greets them when they are new to Sternpost. */
export interface Recipient {
  email: string;
  name?: string;
}

/**
 * "Nessa Quick <nessa.quick@survey.example>" or a bare address: the address is the word with an
 * "@" (angle brackets optional), the name is what stands before it.
 */
function readRecipient(line: string): { email: string; name?: string } {
  const words = line.trim().split(/\s+/);
  const at = words.findLastIndex((w) => w.includes("@"));
  if (at === -1) return { email: line.trim().toLowerCase() };
  const email = words[at]!.replace(/^<|>$/g, "").toLowerCase();
  const name = words.slice(0, at).join(" ").replace(/^"|"$/g, "").trim();
  return name ? { email, name } : { email };
}

/** Surveyors, one per line (or a bare address list separated by commas). */
export const issueRecordSchema = z.object({
  intent: z.literal("issue-record"),
  emails: z
    .string({ error: "Enter the surveyor's name and e-mail address." })
    .transform((text) => {
      // Commas and spaces separate bare addresses only: "Quick, Nessa <…>" keeps its comma.
      const lines = text.split(/\n|;/).flatMap((l) => {
        const bare = l.split(/[\s,]+/).filter(Boolean);
        return bare.every((w) => w.includes("@")) ? bare : [l];
      });
      const seen = new Set<string>();
      return lines
        .filter((l) => l.trim())
        .map(readRecipient)
        .filter((r) => !seen.has(r.email) && !!seen.add(r.email));
    })
    .pipe(
      z
        .array(
          z.object({
            email: z.email({ error: "That is not an e-mail address." }),
            name: z.string().max(120, "A name is at most 120 characters.").optional(),
          }),
        )
        .min(1, "Enter the surveyor's name and e-mail address.")
        .max(10, "Issue to at most ten surveyors at a time."),
    ),
});
