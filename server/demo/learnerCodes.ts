// Pseudonymous learner codes such as L-7F3K2. Learners never appear by name anywhere in Quarterbeat.
import type { Random } from "./random";

// No 0/O or 1/I, which are easy to confuse when a code is read aloud or copied by hand.
const ALPHABET = "23456789ABCDEFGHJKLMNPQRSTUVWXYZ";

export function newLearnerCode(used: Set<string>, random: Random): string {
  for (;;) {
    let code = "L-";
    for (let i = 0; i < 5; i++) code += ALPHABET[random.int(0, ALPHABET.length - 1)];
    if (!used.has(code)) {
      used.add(code);
      return code;
    }
  }
}
