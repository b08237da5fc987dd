// Deal rows for benchmarks: deterministic ids, many households and deals per statement.
// Shared by the deals-table benchmark and the cluster benchmark.
import type mysql from "mysql2/promise";

export const STAGES = ["lead", "bills_in", "designing", "proposal_out", "signed", "deposit_paid", "survey", "permitting", "install_booked", "installed", "inspected", "live", "on_hold", "lost", "cancelled"];
const SOURCES = ["Referral", "Website", "Door to door", "Home show", "Phone"];
const CITIES = ["Greensboro", "Durham", "Raleigh", "Asheville", "Wilmington", "Boone", "High Point", "Cary"];
const STREETS = ["Pine Row", "Larkmoor Drive", "Millrace Path", "Ember Ridge Drive", "Saltbox Way", "Copperbeech Street"];
const INSERT_BATCH = 2_000;

export function rng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

const hex = (n: number, width: number) => n.toString(16).padStart(width, "0");
/** Deterministic UUID-shaped ids: the kind digit keeps households and deals apart. */
export const seqId = (kind: number, company: number, i: number) => `${hex(i, 8)}-${hex(company, 4)}-4${hex(kind, 3)}-8000-${hex(i * 7919, 12).slice(-12)}`;

/** Adds deals [from, to) to a company, households first, INSERT_BATCH rows per statement. */
export async function seedDeals(conn: mysql.Connection, companyId: string, companyNo: number, from: number, to: number, owners: string[]) {
  const rand = rng(1000 * companyNo + from);
  const base = Date.UTC(2023, 0, 1);
  const span = Date.UTC(2026, 0, 1) - base;
  for (let start = from; start < to; start += INSERT_BATCH) {
    const homes: unknown[][] = [];
    const deals: unknown[][] = [];
    for (let i = start; i < Math.min(to, start + INSERT_BATCH); i++) {
      const hid = seqId(1, companyNo, i);
      homes.push([
        hid,
        companyId,
        `${["Alder", "Birch", "Cedar", "Dogwood", "Elm", "Fir", "Gum", "Holly"][i % 8]} ${String(i).padStart(6, "0")} household`,
        `Contact ${i}`,
        `${1 + (i % 900)} ${STREETS[i % STREETS.length]}`,
        CITIES[Math.floor(rand() * CITIES.length)],
        "NC",
        "27401",
        36,
        -79.8,
      ]);
      const created = new Date(base + Math.floor(rand() * span));
      const priced = rand() >= 0.15;
      deals.push([
        seqId(2, companyNo, i),
        companyId,
        hid,
        rand() < 0.03 ? null : owners[Math.floor(rand() * owners.length)],
        STAGES[Math.floor(rand() * STAGES.length)],
        new Date(created.getTime() + Math.floor(rand() * 120) * 86_400_000),
        rand() < 0.05 ? null : SOURCES[Math.floor(rand() * SOURCES.length)],
        priced ? Math.floor(rand() * 400) * 10_000 : null,
        priced ? 3_000 + Math.floor(rand() * 120) * 100 : null,
        created,
        created,
      ]);
    }
    await conn.query("INSERT INTO household (id, company_id, name, contact_name, street, city, region, postal_code, latitude, longitude) VALUES ?", [homes]);
    await conn.query(
      "INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, stage_changed_at, source, contract_cents, system_dc_watts, created_at, updated_at) VALUES ?",
      [deals],
    );
  }
}
