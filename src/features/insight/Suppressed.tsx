// Stands in for a value that is hidden because its group is too small to show without exposing learners.
// It says so in words; it never looks like a zero.
import { suppressedText, suppressionTitle } from "./format";

export function Suppressed({ minCount, className }: { minCount: number; className?: string }) {
  return (
    <span className={className ?? "text-small font-medium text-muted italic"} title={suppressionTitle(minCount)}>
      {suppressedText(minCount)}
    </span>
  );
}
