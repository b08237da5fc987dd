// Job dates are calendar days (YYYY-MM-DD); shown in UTC so a date never slips a day.
const short = new Intl.DateTimeFormat("en-US", { month: "short", day: "numeric", year: "numeric", timeZone: "UTC" });
const weekday = new Intl.DateTimeFormat("en-US", { weekday: "short", month: "short", day: "numeric", timeZone: "UTC" });
const long = new Intl.DateTimeFormat("en-US", { weekday: "long", month: "long", day: "numeric", year: "numeric", timeZone: "UTC" });

const asDate = (iso: string) => new Date(`${iso}T00:00:00Z`);
export const shortDate = (iso: string) => short.format(asDate(iso));
export const weekdayDate = (iso: string) => weekday.format(asDate(iso));
export const longDate = (iso: string) => long.format(asDate(iso));
