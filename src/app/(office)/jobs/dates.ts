// Job dates are calendar days (YYYY-MM-DD), shown as they are (src/lib/format.ts).
import { formatCalendarDate } from "@/lib/format";

export const shortDate = (iso: string) => formatCalendarDate(iso);
export const weekdayDate = (iso: string) => formatCalendarDate(iso, "weekday-day");
export const longDate = (iso: string) => formatCalendarDate(iso, "full");
