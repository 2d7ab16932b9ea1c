// "How these figures are made": how an attempt is scored, the target bands, the guideline sources, how
// small figures are protected, and the caution that Quarterbeat is a training tool.
import type { ReportData } from "../../../shared/schemas/report";
import { ReportTable } from "./ReportTable";

export function MethodsBox({ data }: { data: ReportData }) {
  const { methods } = data;
  const versions = methods.scoredUnderVersions;
  return (
    <section
      aria-labelledby="report-methods"
      className="flex flex-col gap-4 rounded-card border border-line-strong bg-paper p-4 sm:p-6 print:break-before-page"
    >
      <h3 id="report-methods" className="text-title">
        How these figures are made
      </h3>

      <div className="flex flex-col gap-2">
        <h4 className="font-semibold">How an attempt is scored</h4>
        <p>Every measured attempt on a training manikin passes only if it meets all of these:</p>
        <ul className="list-disc pl-5">
          {methods.passRule.map((rule) => (
            <li key={rule}>{rule}</li>
          ))}
        </ul>
        <p className="text-small text-muted">{methods.passRuleNote}</p>
        {versions.length > 0 && (
          <p className="text-small text-muted">
            This period's attempts were scored under policy version{versions.length === 1 ? "" : "s"} {versions.join(", ")}; the targets below are from version{" "}
            {data.policyVersion}.
          </p>
        )}
      </div>

      <div className="flex flex-col gap-2">
        <h4 className="font-semibold">Targets by patient type</h4>
        <ReportTable
          caption="Compression targets by patient type"
          rows={methods.bands}
          rowKey={(b) => b.key}
          columns={[
            { header: "Patient type", cell: (b) => b.label },
            { header: "Depth", cell: (b) => b.depth },
            { header: "Rate", cell: (b) => b.rate },
            { header: "Recoil", cell: (b) => b.recoil },
          ]}
        />
      </div>

      <div className="flex flex-col gap-2">
        <h4 className="font-semibold">Guideline sources</h4>
        <ol className="list-decimal pl-5 text-small">
          {methods.sources.map((source) => (
            <li key={source}>{source}</li>
          ))}
        </ol>
      </div>

      <div className="flex flex-col gap-2">
        <h4 className="font-semibold">Small numbers</h4>
        <p className="text-small">{methods.suppressionNote}</p>
        <p className="text-small text-muted">
          Intervals are 95 % Wilson score intervals: the range the true rate most likely lies in, given how many attempts were measured.
        </p>
      </div>

      <aside aria-label="Caution" className="flex items-start gap-2 rounded-control border border-marigold-300 bg-marigold-100 px-4 py-3 text-small text-ink">
        <svg viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0 text-marigold-700" aria-hidden="true">
          <circle cx="10" cy="10" r="8.5" fill="none" stroke="currentColor" strokeWidth="1.8" />
          <path d="M10 5.5v6M10 14v.5" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        </svg>
        <p>{methods.safetyNote}</p>
      </aside>
    </section>
  );
}
