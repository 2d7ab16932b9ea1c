// Imports (coordinators and instructors): bring class logs, attempts, compression streams and equipment
// events in from CSV files, step by step, and see what every earlier import changed.
import { useCallback, useState } from "react";
import { PageHeader } from "../../components/PageHeader";
import { useCan } from "../auth/useCan";
import { ImportHistory } from "./ImportHistory";
import { ImportWizard } from "./ImportWizard";

export default function ImportsPage() {
  const importsForEveryone = useCan("importData", "any");
  const [lastBatch, setLastBatch] = useState<number | null>(null);
  const imported = useCallback((batchId: number | null) => setLastBatch(batchId), []);
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        title="Imports"
        description={
          importsForEveryone
            ? "Bring CSV files from class logs, manikins and equipment records into Quarterbeat. Every file is checked first; nothing is written until you confirm."
            : "Bring in the CSV files of your own classes and the attempts measured in them. Every file is checked first; nothing is written until you confirm."
        }
      />
      <ImportWizard onImported={imported} />
      <ImportHistory highlightBatch={lastBatch} />
    </div>
  );
}
