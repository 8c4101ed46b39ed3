// The review period (design.md "Words"): from the event's start until the organiser closes
// review, by default 30 days after the event ends. Answers to coordinators' questions and
// corrections are taken throughout, also once the event itself is closed for new records.

export const REVIEW_PERIOD_DEFAULT_DAYS = 30; // design.md "review period"

/** When review closes: the organiser's date, or 30 days after the end. */
export function reviewClosesAt(event: { endsAt: Date | string; reviewClosesAt?: Date | string | null }): Date {
  if (event.reviewClosesAt) return new Date(event.reviewClosesAt);
  return new Date(new Date(event.endsAt).getTime() + REVIEW_PERIOD_DEFAULT_DAYS * 86_400_000);
}

/** Whether answers and corrections are taken at `now`. Draft events have no review period. */
export function reviewOpen(
  event: { status: string; startsAt: Date | string; endsAt: Date | string; reviewClosesAt?: Date | string | null },
  now: Date,
): boolean {
  if (event.status === "draft") return false;
  if (event.status === "open") return true;
  return now.getTime() >= new Date(event.startsAt).getTime() && now.getTime() <= reviewClosesAt(event).getTime();
}
