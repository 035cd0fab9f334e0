import type { ZxcvbnFactory } from "@zxcvbn-ts/core";
import { newPasswordSchema } from "~/lib/validation/people";

// The estimator and its dictionaries stay on the server: they are large, and the browser only
// needs the length rules to give quick feedback. They are loaded when a password is first set
// (about 30 MB of memory a server does not need until then).
let estimator: Promise<ZxcvbnFactory> | undefined;
function strength() {
  estimator ??= Promise.all([
    import("@zxcvbn-ts/core"),
    import("@zxcvbn-ts/language-common"),
    import("@zxcvbn-ts/language-en"),
  ]).then(
    ([{ ZxcvbnFactory }, common, english]) =>
      new ZxcvbnFactory({
        dictionary: { ...common.dictionary, ...english.dictionary },
        graphs: common.adjacencyGraphs,
        translations: english.translations,
      }),
  );
  return estimator;
}

/** zxcvbn's score 3 is "safely unguessable: moderate protection from offline slow-hash attacks". */
const MIN_SCORE = 3;
/** Words a guesser would try first against this yard's accounts. */
const YARD_WORDS = ["sternpost", "kittiwake", "slip", "boatyard", "engine", "marine"];

/** The invitation's password rules, with the strength check that only the server runs. */
export async function strongPasswordSchema(knownAbout: string[]) {
  const estimator = await strength();
  return newPasswordSchema.superRefine((value, ctx) => {
    const result = estimator.check(value.password, [...YARD_WORDS, ...knownAbout]);
    if (result.score >= MIN_SCORE) return;
    const hint = result.feedback.warning ? ` ${result.feedback.warning}.` : "";
    ctx.addIssue({
      code: "custom",
      path: ["password"],
      message: `This password is too easy to guess.${hint} Try three or four unrelated words.`,
    });
  });
}
