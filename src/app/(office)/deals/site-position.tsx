"use client";
import { useState } from "react";
import type { UseFormReturn } from "react-hook-form";
import { FormMessage, type Notice } from "@/components/ui/field";
import { api } from "@/lib/api-client";
import type { HouseholdInput } from "@/lib/schemas/deal";

type ZipPlace = { zip: string; city: string; region: string; latitude: number; longitude: number };

/** Six decimals (about 0.1 m), what the household table stores. */
const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

/** A tablet's fix worse than this is shown as a warning (our choice: about a city block). */
const COARSE_FIX_M = 150;

/** What the browser's geolocation error means for the rep (W3C Geolocation API, GeolocationPositionError codes). */
function geolocationRefusal(code: number | null): string {
  if (code === null) return "This browser cannot share its location. Use the ZIP's position or type the coordinates.";
  if (code === 1) return "Location is blocked for Kilowright on this device. Allow location in the browser's site settings and press the button again, or type the coordinates.";
  if (code === 3) return "No position came within 20 seconds. Try again near a window or outside, or type the coordinates.";
  return "The device could not find its position (no GPS or network fix). Try again, or type the coordinates.";
}

/**
 * Two ways to a first position for the site besides typing it: the ZIP code's listed position
 * (offline list on the server) and the tablet's own location when the rep stands at the house.
 */
export function SitePosition({ form }: { form: UseFormReturn<HouseholdInput> }) {
  const [notice, setNotice] = useState<Notice | null>(null);
  const [busy, setBusy] = useState<"zip" | "here" | null>(null);

  function place(latitude: number, longitude: number) {
    form.setValue("latitude", round6(latitude), { shouldDirty: true, shouldValidate: true });
    form.setValue("longitude", round6(longitude), { shouldDirty: true, shouldValidate: true });
  }

  async function fromZip() {
    const zip = String(form.getValues("postalCode") ?? "").trim().slice(0, 5);
    if (!/^[0-9]{5}$/.test(zip)) {
      form.setError("postalCode", { message: "Enter the 5-digit ZIP first" });
      return;
    }
    setBusy("zip");
    try {
      const found = await api<ZipPlace>(`/api/zip-codes/${zip}`);
      place(found.latitude, found.longitude);
      if (!String(form.getValues("city") ?? "").trim()) form.setValue("city", found.city, { shouldDirty: true });
      if (!String(form.getValues("region") ?? "").trim()) form.setValue("region", found.region, { shouldDirty: true });
      setNotice({ tone: "info", text: `Position of ZIP ${found.zip} (${found.city}, ${found.region}): a first guess, a few kilometres off at most. At the house, use its location or adjust the numbers.` });
    } catch (err) {
      setNotice({ tone: "error", text: err instanceof Error ? err.message : "The ZIP could not be looked up." });
    } finally {
      setBusy(null);
    }
  }

  function fromDevice() {
    if (typeof navigator === "undefined" || !navigator.geolocation) {
      setNotice({ tone: "error", text: geolocationRefusal(null) });
      return;
    }
    setBusy("here");
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        setBusy(null);
        place(pos.coords.latitude, pos.coords.longitude);
        const accuracy = Math.round(pos.coords.accuracy);
        setNotice(
          accuracy > COARSE_FIX_M
            ? { tone: "info", text: `Position from this device, but only within ${accuracy.toLocaleString("en-US")} m: check it, or adjust the numbers.` }
            : { tone: "success", text: `Position from this device, within ${accuracy} m.` },
        );
      },
      (err) => {
        setBusy(null);
        setNotice({ tone: "error", text: geolocationRefusal(err.code) });
      },
      { enableHighAccuracy: true, timeout: 20_000, maximumAge: 60_000 },
    );
  }

  return (
    <div className="space-y-2 sm:col-span-2">
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-quiet" onClick={fromDevice} disabled={busy !== null}>
          {busy === "here" ? "Finding the house…" : "I'm at the house"}
        </button>
        <button type="button" className="btn-quiet" onClick={() => void fromZip()} disabled={busy !== null}>
          {busy === "zip" ? "Looking up the ZIP…" : "Position from ZIP"}
        </button>
      </div>
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
    </div>
  );
}
