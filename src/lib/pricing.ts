// Pricing one offer from the company's price book. Pure: no server or browser imports, so the
// rep's screen and the server compute the same figures. All amounts are integer cents; each
// line is rounded to the cent once, and totals are sums of the rounded lines.
import type { Role } from "@/lib/enums";
import type { DiscountLimit, PriceBook } from "@/lib/schemas/price-book";

export type OfferPricingInput = {
  /** System size, watts DC (STC). */
  dcWatts: number;
  moduleCount: number;
  adderIds: readonly string[];
  lineItemIds: readonly string[];
  discountCents: number;
  /** Role of the person giving the discount. */
  role: Role;
};

export type PriceLineHow =
  | { per: "watt"; watts: number; centsPerWatt: number }
  | { per: "module"; modules: number; centsEach: number }
  | { per: "job" }
  | { per: "off"; cents: number };

export type PriceLine = {
  kind: "base" | "adder" | "line-item" | "discount";
  /** Adder or line item id; absent for base and discount. */
  id?: string;
  label: string;
  /** How the amount was reached, e.g. "7,200 W × 285 ¢/W". */
  detail: string;
  /** The same as data, for the homeowner's language (absent on figures computed before it was recorded). */
  how?: PriceLineHow;
  /** Negative for the discount. */
  amountCents: number;
};

export type OfferPrice = {
  /** The size band's price and range that priced the whole system. */
  band: { index: number; minWatts: number; maxWatts: number | null; centsPerWattDc: number };
  baseCents: number;
  addersCents: number;
  lineItemsCents: number;
  /** Base + adders + line items, before discount. */
  grossCents: number;
  discountCents: number;
  /** Gross − discount: what the customer signs for (before incentives). */
  contractCents: number;
  /** The most this role may give without approval; null = no limit (owner, admin). */
  discountLimitCents: number | null;
  discountNeedsApproval: boolean;
  depositCents: number;
  lines: PriceLine[];
};

/** Bad pricing input (unknown adder, discount above the price, …), naming the field. */
export class PricingInputError extends Error {
  constructor(
    readonly path: string,
    message: string,
  ) {
    super(`${path}: ${message}`);
    this.name = "PricingInputError";
  }
}

const UNLIMITED_ROLES: readonly Role[] = ["owner", "admin"];

const num = (n: number) => n.toLocaleString("en-US", { maximumFractionDigits: 2 });
const usd = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/** The band whose [minWatts, maxWatts) holds the size: a system exactly on a boundary takes the upper band's price. */
export function bandFor(book: PriceBook, dcWatts: number): OfferPrice["band"] {
  const index = book.bands.findIndex((b) => dcWatts >= b.minWatts && (b.maxWatts === null || dcWatts < b.maxWatts));
  if (index < 0) throw new PricingInputError("dcWatts", `no size band covers ${num(dcWatts)} W`);
  const b = book.bands[index];
  return { index, minWatts: b.minWatts, maxWatts: b.maxWatts, centsPerWattDc: b.centsPerWattDc };
}

/** The most `role` may discount `grossCents` without approval (null: no limit). */
export function discountLimitCents(book: PriceBook, role: Role, grossCents: number): number | null {
  if (UNLIMITED_ROLES.includes(role)) return null;
  const limit: DiscountLimit | undefined = role === "sales_rep" || role === "office_manager" ? book.discountLimits[role] : undefined;
  // Crew (and any role without a limit) gives no discount without approval.
  if (!limit || (limit.maxCents === null && limit.maxPct === null)) return 0;
  const caps: number[] = [];
  if (limit.maxCents !== null) caps.push(limit.maxCents);
  // The percentage is of the price before discount, rounded down to the cent (never more than allowed).
  if (limit.maxPct !== null) caps.push(Math.floor((grossCents * limit.maxPct) / 100 + 1e-9));
  return Math.min(...caps);
}

/**
 * Why `decider` may not decide a discount request, or null when they may. Separation of duties
 * (common practice, the "four-eyes" rule): never the person who asked, and only someone whose own
 * limit on this price covers the discount asked, so an office manager's over-limit discount goes
 * to an owner or admin. The role's `discounts:approve` permission is checked by the caller.
 */
export function discountDecisionRefusal(
  book: PriceBook,
  decider: { userId: string; role: Role },
  request: { requestedByUserId: string | null; amountCents: number; grossCents: number },
): string | null {
  if (request.requestedByUserId !== null && request.requestedByUserId === decider.userId) {
    return "You asked for this discount, so someone else decides it: an owner, an admin or an office manager whose limit covers it.";
  }
  const limit = discountLimitCents(book, decider.role, request.grossCents);
  if (limit !== null && limit < request.amountCents) {
    return `This discount of ${usd(request.amountCents)} is above your own limit of ${usd(limit)} on this price, so an owner or admin decides it.`;
  }
  return null;
}

/** The deposit the policy asks on a contract; never more than the contract itself. */
export function depositFor(book: PriceBook, contractCents: number): number {
  const d = book.deposit;
  const raw = d.kind === "fixed" ? d.amountCents : Math.min(d.maxCents, Math.max(d.minCents, Math.round((contractCents * d.pct) / 100)));
  return Math.min(raw, contractCents);
}

export function priceOffer(book: PriceBook, input: OfferPricingInput): OfferPrice {
  const { dcWatts, moduleCount, discountCents, role } = input;
  if (!Number.isFinite(dcWatts) || dcWatts < 0) throw new PricingInputError("dcWatts", "must be a number of watts ≥ 0");
  if (!Number.isInteger(moduleCount) || moduleCount < 0) throw new PricingInputError("moduleCount", "must be a whole number ≥ 0");
  if (!Number.isInteger(discountCents) || discountCents < 0) throw new PricingInputError("discountCents", "must be whole cents ≥ 0");

  const lines: PriceLine[] = [];
  const band = bandFor(book, dcWatts);
  const baseCents = Math.round(dcWatts * band.centsPerWattDc);
  lines.push({
    kind: "base",
    label: "System price",
    detail: `${num(dcWatts)} W × ${num(band.centsPerWattDc)} ¢/W`,
    how: { per: "watt", watts: dcWatts, centsPerWatt: band.centsPerWattDc },
    amountCents: baseCents,
  });

  let addersCents = 0;
  input.adderIds.forEach((id, i) => {
    const adder = book.adders.find((a) => a.id === id);
    if (!adder) throw new PricingInputError(`adderIds.${i}`, `unknown adder "${id}"`);
    let amountCents: number;
    let detail: string;
    let how: PriceLineHow;
    if (adder.kind === "per_watt") {
      amountCents = Math.round(dcWatts * adder.centsPerWattDc);
      detail = `${num(dcWatts)} W × ${num(adder.centsPerWattDc)} ¢/W`;
      how = { per: "watt", watts: dcWatts, centsPerWatt: adder.centsPerWattDc };
    } else if (adder.kind === "per_module") {
      amountCents = moduleCount * adder.centsPerModule;
      detail = `${moduleCount} modules × ${usd(adder.centsPerModule)}`;
      how = { per: "module", modules: moduleCount, centsEach: adder.centsPerModule };
    } else {
      amountCents = adder.amountCents;
      detail = "per job";
      how = { per: "job" };
    }
    addersCents += amountCents;
    lines.push({ kind: "adder", id, label: adder.name, detail, how, amountCents });
  });

  let lineItemsCents = 0;
  input.lineItemIds.forEach((id, i) => {
    const item = book.lineItems.find((l) => l.id === id);
    if (!item) throw new PricingInputError(`lineItemIds.${i}`, `unknown line item "${id}"`);
    lineItemsCents += item.amountCents;
    lines.push({ kind: "line-item", id, label: item.name, detail: "per job", how: { per: "job" }, amountCents: item.amountCents });
  });

  const grossCents = baseCents + addersCents + lineItemsCents;
  if (discountCents > grossCents) throw new PricingInputError("discountCents", `must not exceed the price of ${usd(grossCents)}`);
  if (discountCents > 0) lines.push({ kind: "discount", label: "Discount", detail: `${usd(discountCents)} off`, how: { per: "off", cents: discountCents }, amountCents: -discountCents });
  const contractCents = grossCents - discountCents;
  const limit = discountLimitCents(book, role, grossCents);

  return {
    band,
    baseCents,
    addersCents,
    lineItemsCents,
    grossCents,
    discountCents,
    contractCents,
    discountLimitCents: limit,
    discountNeedsApproval: limit !== null && discountCents > limit,
    depositCents: depositFor(book, contractCents),
    lines,
  };
}

/**
 * The offer's price in the engine's quote-case form (src/engine/quote.ts `price`): the engine
 * prices dcWatts × perWattCents + adders − discount, so adders and line items both go in
 * `adders` and the result equals `contractCents`.
 */
export function toQuotePrice(price: OfferPrice): { perWattCents: number; adders: { label: string; amountCents: number }[]; discountCents: number } {
  return {
    perWattCents: price.band.centsPerWattDc,
    adders: price.lines.filter((l) => l.kind === "adder" || l.kind === "line-item").map((l) => ({ label: l.label, amountCents: l.amountCents })),
    discountCents: price.discountCents,
  };
}
