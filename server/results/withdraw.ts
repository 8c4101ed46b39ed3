import "server-only";
import { getReport, inReportTransaction, insertWithdrawal } from "@/db/queries/reports";
import { ApiError } from "@/lib/http/errors";

/**
 * Withdraws a published version with a reason (issue 16). The report row never changes (it is
 * append-only): the withdrawal is a row of its own, so the version's page, numbers and files stay
 * and say why it was withdrawn. Under the event's report lock, like publishing.
 */
export async function withdrawReport(
  eventId: string,
  version: number,
  userId: string,
  reason: string,
): Promise<{ id: string; version: number }> {
  const report = await getReport(eventId, version, { primary: true });
  if (!report) throw new ApiError("not_found");
  return inReportTransaction(eventId, async (tx) => {
    if (!(await insertWithdrawal(report.id, userId, reason, tx))) throw new ApiError("conflict");
    return { id: report.id, version };
  });
}
