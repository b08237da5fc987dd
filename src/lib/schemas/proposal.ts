// Proposals: the frozen snapshot a proposal carries (table proposal, column snapshot) and the
// inputs of sending, signing, asking and cancelling. The snapshot copies every figure, so the
// customer's page and the PDF read only it, never the live offers, catalog or price book.
import { z } from "zod";
import type { Locale } from "@/lib/i18n/locales";
import { plainText } from "@/lib/schemas/text";
import type { SnapshotText } from "@/lib/snapshot-text";
import type { OfferFigures } from "@/lib/offer-figures";
import type { OfferInputs } from "@/lib/schemas/offer";

export const DEFAULT_PROPOSAL_LINK_DAYS = 30;

export type ProposalSnapshotOffer = {
  /** The offer's position in the deal (1–3), the customer's choice refers to it. */
  position: number;
  name: string;
  inputs: OfferInputs;
  figures: OfferFigures;
  equipment: {
    module: { manufacturer: string; model: string; stcWatts: number };
    inverter: { manufacturer: string; model: string; kind: "string" | "micro"; acWatts: number };
    moduleCount: number;
    faces: { name: string; tiltDeg: number; azimuthDeg: number; moduleCount: number; solarAccessPct: number }[];
  };
  /** The deposit the company's policy asks for this offer's contract, in cents. */
  depositCents: number;
};

export type ProposalSnapshot = {
  version: 1;
  /** When the snapshot was taken (ISO). */
  takenAt: string;
  company: { name: string; licenseNumber: string | null };
  rep: { name: string; email: string };
  household: {
    name: string;
    contactName: string | null;
    email: string | null;
    phone: string | null;
    street: string;
    city: string;
    region: string;
    postalCode: string;
    latitude: number;
    longitude: number;
    /** The language the proposal was sent in (its PDF's); absent on proposals sent before there was a choice: English. */
    language?: Locale;
  };
  utilityName: string | null;
  /** The weather station the figures' typical year was measured at, and how far from the home (absent on older snapshots and for a typed production figure). */
  station?: { name: string; latitude: number; longitude: number; distanceKm: number };
  /** Monthly usage the offers were computed from (kWh, Jan–Dec) and where it came from. */
  usage: { monthlyKwh: number[]; source: string };
  /** Weather source, system losses and other design assumptions, as sentences. */
  assumptions: string[];
  offers: ProposalSnapshotOffer[];
  /** The usual cautions shown with every proposal. */
  cautions: string[];
  /**
   * The homeowner texts above as catalog messages, printed in the reader's language: assumptions,
   * cautions, the notes on the figures, and each offer's price lines and incentive details (in the
   * order of its figures' lists). Absent on snapshots made before: those print `assumptions`
   * and `cautions` as stored (English).
   */
  texts?: {
    assumptions: SnapshotText[];
    cautions: SnapshotText[];
    notes: SnapshotText[];
    /** Per offer: its price lines' labels and details (a price-book name stays as typed), its incentives' details and reasons. */
    offers: { position: number; priceLines: { label: SnapshotText; detail: SnapshotText }[]; applied: SnapshotText[]; skipped: SnapshotText[] }[];
  };
};

const email = z.string().trim().toLowerCase().email("Enter a valid e-mail address").max(320);

/** POST /api/proposals — freeze the deal's offers and send them. */
export const sendProposalSchema = z.object({
  dealId: z.string().uuid("Unknown deal"),
  /** Which offers go in (1–3); all of the deal's by default. */
  offerIds: z.array(z.string().uuid()).min(1, "Pick at least one offer").max(3, "A proposal holds at most 3 offers").optional(),
  toEmail: email,
  message: plainText({ multiline: true }).trim().max(2000).default(""),
  validDays: z.number().int("Whole days").min(1, "At least 1 day").max(90, "At most 90 days").default(DEFAULT_PROPOSAL_LINK_DAYS),
  inHomeSale: z.boolean().default(true),
});

/** POST /p/[token]/code — check the one-time code. */
export const verifyCodeSchema = z.object({ code: z.string().trim().regex(/^\d{6}$/, "Enter the 6 digits from the e-mail") });

/** POST /p/[token]/sign */
export const signProposalSchema = z.object({
  position: z.number().int().min(1).max(3),
  signerName: plainText().trim().min(2, "Type your full name").max(200),
  consent: z.literal(true, { error: "Agree to sign electronically to continue" }),
  /** The drawn signature as a PNG data URL. */
  signaturePng: z
    .string()
    .startsWith("data:image/png;base64,", "Draw your signature")
    .max(400_000, "The signature drawing is too large; clear it and draw again"),
  /** How the signature image was made: drawn on the pad, or the typed name adopted as the signature (the keyboard's way). */
  signatureMethod: z.enum(["drawn", "typed"], { error: "Draw your signature, or use your typed name as your signature" }).default("drawn"),
});

/** POST /p/[token]/questions */
export const proposalQuestionSchema = z.object({ question: plainText({ multiline: true }).trim().min(3, "Write your question").max(2000, "Keep it under 2,000 characters") });

/** Largest file the public /verify page checks (a signed copy is a few hundred kB; our choice). */
export const MAX_VERIFY_FILE_BYTES = 25 * 1024 * 1024;
