/** Finding one model's record and one claim's verdict in a catalogue report, with a clear error when absent. */
import type { CatalogueReport } from '../../../src/catalogue/verify/catalogue.ts';
import type { ModelRecord } from '../../../src/catalogue/records/model-record.ts';

export function recordLookup(report: () => CatalogueReport) {
  const record = (id: string): ModelRecord => {
    const r = report().records.find((x) => x.id === id);
    if (!r) throw new Error(`no record for ${id}`);
    return r;
  };
  const verdict = (id: string, claim: string) => {
    const v = record(id).claims.find((c) => c.claim === claim);
    if (!v) throw new Error(`${id} has no verdict for ${claim}: ${record(id).claims.map((c) => c.claim).join(', ')}`);
    return v;
  };
  return { record, verdict };
}
