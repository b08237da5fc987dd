"use client";
// Signing on the customer's phone: confirm the e-mail with a one-time code, read and accept the
// electronic-records disclosure, type the name, draw the signature (signature_pad, pointer
// events) or adopt the typed name as the signature, sign. The server checks everything again;
// this screen only guides. A phone's resizes (rotation, browser bars) keep the drawing, and a
// reload within the confirmation's 30 minutes goes straight back to the signing form.
import { useCallback, useEffect, useRef, useState, type FormEvent, type RefObject } from "react";
import type SignaturePad from "signature_pad";
import { Field, StatusMessage, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { api, ApiError } from "@/lib/api-client";
import { fieldErrorsToErrors } from "@/lib/form-errors";
import { formatCents } from "@/lib/format";

type Chosen = { position: number; name: string; contractCents: number };
type Props = { token: string; label: string; companyName: string; repName: string; repEmail: string; chosen: Chosen };

type Step = "checking" | "start" | "code" | "sign";

/** Where this browser stands with the code (GET …/verify-code): the confirmation lives server-side, keyed by an httpOnly cookie. */
type CodeState = { verified: boolean; minutesLeft: number; codePending: boolean; sentTo: string | null };

/** Set just before the page refreshes into its signed state, so the confirmation takes the focus. */
export const JUST_SIGNED_KEY = "kw-just-signed";

export function SigningPanel({ token, label, companyName, repName, repEmail, chosen }: Props) {
  const base = `/api/public/proposals/${token}`;
  const { step, setStep, sentTo, code, setCode, codeError, message, setMessage, busy, requestCode, verify } = useCodeStep(base);

  return (
    <section aria-labelledby="sign-heading" className="card p-4" data-testid="signing-panel">
      <h2 id="sign-heading" className="text-lg font-semibold">
        Sign this proposal
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">
        You are signing for <strong className="text-graphite">&ldquo;{chosen.name}&rdquo;</strong> at <span className="figure font-semibold text-graphite">{formatCents(chosen.contractCents)}</span>. To choose
        another option, pick it above.
      </p>

      {step === "checking" ? <p className="mt-4 text-sm text-graphite-soft">Checking whether you already confirmed your e-mail…</p> : null}

      {step === "start" ? (
        <div className="mt-4">
          <p className="text-sm">First, confirm it is you: we e-mail a one-time code to the address this proposal was sent to.</p>
          <button type="button" className="btn-primary mt-3 w-full" onClick={requestCode} disabled={busy}>
            E-mail me a code
          </button>
        </div>
      ) : null}

      {step === "code" ? (
        <CodeForm code={code} setCode={setCode} codeError={codeError} busy={busy} sentTo={sentTo} onSubmit={verify} onResend={requestCode} />
      ) : null}

      {message ? (
        <div className="mt-3">
          <StatusMessage notice={message} />
        </div>
      ) : null}

      {step === "sign" ? (
        <SignForm
          base={base}
          label={label}
          companyName={companyName}
          repName={repName}
          repEmail={repEmail}
          chosen={chosen}
          token={token}
          onNeedCode={(text) => {
            setStep("start");
            setMessage({ tone: "error", text });
          }}
        />
      ) : null}
    </section>
  );
}

/** Our own wording of the consumer disclosures of the ESIGN Act, 15 U.S.C. 7001(c)(1). */
export function EsignDisclosure({ companyName, repName, repEmail }: { companyName: string; repName: string; repEmail: string }) {
  return (
    <div className="space-y-2 rounded-md border border-paper-line bg-paper-deep p-3 text-sm" data-testid="esign-disclosure">
      <h3 className="font-semibold">Before you sign electronically</h3>
      <p>
        <strong>What you agree to.</strong> This proposal, the agreement you sign, its signed copy and the notices about it are given to you electronically: on this page and
        by e-mail to the address the proposal was sent to. Your consent covers this agreement only.
      </p>
      <p>
        <strong>Paper instead.</strong> You do not have to sign electronically. If you would rather sign on paper, do not sign here: ask {repName} for a paper agreement. You can
        also ask {companyName} for a paper copy of any record at any time, free of charge.
      </p>
      <p>
        <strong>Withdrawing your consent.</strong> You may withdraw your consent to electronic records at any time, free of charge, by writing to {repEmail}. From then on we send
        records on paper; a signature you already gave stays valid.
      </p>
      <p>
        <strong>Keeping your contact details current.</strong> If your e-mail address changes, tell {repName} at {repEmail} so notices keep reaching you.
      </p>
      <p>
        <strong>What you need.</strong> A phone or computer with an up-to-date web browser, access to your e-mail, and a program that opens PDF files, plus room on your device
        or a printer to keep a copy. Reading this page and opening the PDF shows you can open the records in the form we use.
      </p>
    </div>
  );
}

function SignForm({
  base,
  label,
  companyName,
  repName,
  repEmail,
  chosen,
  token,
  onNeedCode,
}: {
  base: string;
  label: string;
  companyName: string;
  repName: string;
  repEmail: string;
  chosen: Chosen;
  token: string;
  onNeedCode: (message: string) => void;
}) {
  const [consent, setConsent] = useState(false);
  const [name, setName] = useState("");
  const [typed, setTyped] = useState(false);
  const { canvasRef, padRef, empty, clear } = useSignaturePad(typed ? name.trim() : null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const signing = useSave<{ position: number; signerName: string; consent: true; signaturePng: string; signatureMethod: "drawn" | "typed" }>({
    request: (json) => ({ url: `${base}/sign`, method: "POST", json }),
    onFieldErrors: (fields) => setErrors(fieldErrorsToErrors(fields)),
    // The page refreshes into its signed state; its confirmation takes the focus (SignedHeading).
    onSaved: () => sessionStorage.setItem(JUST_SIGNED_KEY, token),
    onError: (err) => {
      if (err instanceof ApiError && err.code === "code_required") onNeedCode(err.message);
    },
  });

  function sign(e: FormEvent) {
    e.preventDefault();
    const found: Record<string, string> = {};
    if (!consent) found.consent = "Agree to sign electronically to continue";
    if (name.trim().length < 2) found.signerName = "Type your full name";
    const pad = padRef.current;
    const canvas = canvasRef.current;
    if (!typed && (!pad || pad.isEmpty())) found.signaturePng = "Draw your signature in the box, or use your typed name as your signature";
    setErrors(found);
    if (Object.keys(found).length > 0 || !canvas) return;
    signing.save({ position: chosen.position, signerName: name.trim(), consent: true, signaturePng: canvas.toDataURL("image/png"), signatureMethod: typed ? "typed" : "drawn" });
  }

  return (
    <form className="mt-4 space-y-4" onSubmit={sign} noValidate>
      <EsignDisclosure companyName={companyName} repName={repName} repEmail={repEmail} />
      <ConsentField consent={consent} setConsent={setConsent} error={errors.consent} />
      <Field id="signer-name" label="Your full name" autoComplete="name" value={name} error={errors.signerName} onChange={(e) => setName(e.target.value)} />
      <SignatureField canvasRef={canvasRef} empty={empty} typed={typed} setTyped={setTyped} onClear={clear} error={errors.signaturePng} />
      <p className="text-sm">
        By pressing <strong>Sign</strong> you sign proposal {label} for &ldquo;{chosen.name}&rdquo; at <span className="figure">{formatCents(chosen.contractCents)}</span>, and you
        intend your typed name and {typed ? "the signature made from it" : "drawn signature"} to be your signature.
      </p>
      <StatusMessage notice={signing.notice} />
      <button type="submit" className="btn-primary w-full" disabled={signing.pending}>
        {signing.pending ? "Signing…" : "Sign"}
      </button>
    </form>
  );
}

/** The one-time code from the e-mail, with a button for a new one. */
function CodeForm({ code, setCode, codeError, busy, sentTo, onSubmit: verify, onResend: requestCode }: { code: string; setCode: (code: string) => void; codeError: string | null; busy: boolean; sentTo: string | null; onSubmit: (e: FormEvent) => void; onResend: () => void }) {
  return (
    <form className="mt-4 space-y-3" onSubmit={verify} noValidate>
      <Field
        id="signing-code"
        label="6-digit code"
        inputClassName="figure tracking-[0.3em]"
        inputMode="numeric"
        autoComplete="one-time-code"
        maxLength={6}
        value={code}
        error={codeError ?? undefined}
        onChange={(e) => setCode(e.target.value.replace(/\D/g, "").slice(0, 6))}
      />
      <div className="flex flex-col gap-2 sm:flex-row">
        <button type="submit" className="btn-primary flex-1" disabled={busy}>
          Confirm code
        </button>
        <button type="button" className="btn-quiet flex-1" onClick={requestCode} disabled={busy}>
          Send a new code
        </button>
      </div>
      {sentTo ? <p className="text-xs text-graphite-soft">Sent to {sentTo}. Not there? Check the spam folder, or send a new code.</p> : null}
    </form>
  );
}

/** The customer's consent to electronic records and signatures (ESIGN Act, 15 U.S.C. 7001(c)(1)(A)). */
function ConsentField({ consent, setConsent, error }: { consent: boolean; setConsent: (consent: boolean) => void; error: string | undefined }) {
  return (
    <div>
      <label className="flex min-h-touch items-start gap-3 text-sm">
        <input
          type="checkbox"
          className="mt-1 h-5 w-5 accent-copper"
          checked={consent}
          onChange={(e) => setConsent(e.target.checked)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "consent-error" : undefined}
        />
        <span>I have read the above, I can open and keep these records, and I agree to use electronic records and signatures for this agreement.</span>
      </label>
      {error ? (
        <p id="consent-error" className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** The box to draw the signature in, the button to clear it, and the keyboard's way: the typed name as the signature. */
function SignatureField({
  canvasRef,
  empty,
  typed,
  setTyped,
  onClear: clear,
  error,
}: {
  canvasRef: RefObject<HTMLCanvasElement | null>;
  empty: boolean;
  typed: boolean;
  setTyped: (typed: boolean) => void;
  onClear: () => void;
  error: string | undefined;
}) {
  return (
    <div>
      <p id="signature-label" className="field-label">
        Your signature
      </p>
      <canvas
        ref={canvasRef}
        className={`block h-40 w-full touch-none rounded-md border bg-white ${typed ? "border-graphite-faint" : "border-dashed border-graphite-faint"}`}
        role="img"
        aria-labelledby="signature-label"
        aria-describedby="signature-hint"
        data-testid="signature-pad"
      />
      <div className="mt-1 flex items-center justify-between gap-2">
        <p id="signature-hint" className="text-xs text-graphite-soft">
          {typed ? "Your typed name is your signature." : empty ? "Draw with your finger, a stylus or the mouse." : "Signature drawn."}
        </p>
        {typed ? null : (
          <button type="button" className="btn-quiet" onClick={clear}>
            Clear
          </button>
        )}
      </div>
      <label className="mt-2 flex min-h-touch items-start gap-3 text-sm">
        <input type="checkbox" className="mt-1 h-5 w-5 accent-copper" checked={typed} onChange={(e) => setTyped(e.target.checked)} />
        <span>Use my typed name as my signature</span>
      </label>
      {error ? (
        <p className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** Asks the server whether this browser already confirmed a code (a reload within the 30 minutes) or has a code waiting. */
function useCodeState(base: string, apply: (state: CodeState | null) => void) {
  useEffect(() => {
    let stopped = false;
    api<CodeState>(`${base}/verify-code`, { cache: "no-store" })
      .then((state) => !stopped && apply(state))
      .catch(() => !stopped && apply(null));
    return () => {
      stopped = true;
    };
  }, [base, apply]);
}

/** The steps before signing: e-mail a one-time code, then check it. */
function useCodeStep(base: string) {
  const [step, setStep] = useState<Step>("checking");
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [code, setCode] = useState("");
  const [codeError, setCodeError] = useState<string | null>(null);
  const [message, setMessage] = useState<Notice | null>(null);
  useCodeState(
    base,
    useCallback((state: CodeState | null) => {
      if (state?.verified) {
        setStep("sign");
        setMessage({ tone: "success", text: `E-mail confirmed. You have ${state.minutesLeft} ${state.minutesLeft === 1 ? "minute" : "minutes"} left to sign.` });
      } else if (state?.codePending) {
        setSentTo(state.sentTo);
        setStep("code");
      } else setStep("start");
    }, []),
  );
  // The page is this panel's state until the signature: no refresh between the steps.
  const sendCode = useSave<void, { sentTo: string; expiresAt: string }>({
    request: () => ({ url: `${base}/code`, method: "POST" }),
    refresh: false,
    notify: (n) => {
      setMessage(n);
      if (!n) setCodeError(null);
    },
    success: (r) => `We e-mailed a 6-digit code to ${r.sentTo}. It works for 10 minutes.`,
    onSaved: (r) => {
      setSentTo(r.sentTo);
      setCode("");
      setStep("code");
    },
  });
  // A wrong code belongs to the field; a used-up, expired or missing one to the panel.
  const checkCode = useSave<string>({
    request: (value) => ({ url: `${base}/verify-code`, method: "POST", json: { code: value } }),
    refresh: false,
    notify: (n) => n?.tone !== "error" && setMessage(n),
    success: "E-mail confirmed. You have 30 minutes to sign.",
    onSaved: () => setStep("sign"),
    onError: (err) => {
      if (err instanceof ApiError && ["code_locked", "code_expired", "no_code"].includes(err.code)) setMessage({ tone: "error", text: err.message });
      else setCodeError(err.message);
    },
  });
  const busy = sendCode.pending || checkCode.pending;
  const requestCode = () => sendCode.save();

  function verify(e: FormEvent) {
    e.preventDefault();
    if (!/^\d{6}$/.test(code.trim())) {
      setCodeError("Enter the 6 digits from the e-mail");
      return;
    }
    setCodeError(null);
    checkCode.save(code.trim());
  }
  return { step, setStep, sentTo, code, setCode, codeError, message, setMessage, busy, requestCode, verify };
}

/** Writes the typed name across the canvas in a handwriting face, shrunk to fit its width. */
function drawTypedName(canvas: HTMLCanvasElement, name: string) {
  const ctx = canvas.getContext("2d");
  if (!ctx) return;
  const width = canvas.offsetWidth;
  const height = canvas.offsetHeight;
  ctx.save();
  ctx.fillStyle = "#FFFFFF";
  ctx.fillRect(0, 0, width, height);
  let size = Math.min(48, height * 0.45);
  const font = (px: number) => `italic ${px}px "Segoe Script", "Brush Script MT", "URW Chancery L", cursive, serif`;
  ctx.font = font(size);
  while (size > 12 && ctx.measureText(name).width > width - 24) ctx.font = font((size -= 2));
  ctx.fillStyle = PEN;
  ctx.textAlign = "center";
  ctx.textBaseline = "middle";
  ctx.fillText(name, width / 2, height * 0.55);
  ctx.restore();
}

const PEN = "#1F2933";

/**
 * The signature pad on the canvas, loaded in the browser only. When the canvas changes size
 * (rotation; a phone's browser bars hiding as the customer scrolls to Sign), it is refitted for
 * the screen's pixel density and the strokes are put back (signature_pad's toData/fromData).
 * With a typed name (`typedName` not null) the pad takes no strokes and shows the name instead.
 */
function useSignaturePad(typedName: string | null) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const padRef = useRef<SignaturePad | null>(null);
  const typedRef = useRef(typedName);
  const [empty, setEmpty] = useState(true);

  const paint = useCallback(() => {
    const canvas = canvasRef.current;
    const pad = padRef.current;
    if (!canvas || !pad) return;
    if (typedRef.current !== null) {
      pad.off();
      pad.clear();
      drawTypedName(canvas, typedRef.current);
    } else pad.on();
  }, []);

  useEffect(() => {
    let pad: SignaturePad | null = null;
    let cancelled = false;
    const canvas = canvasRef.current;
    const fit = () => {
      if (!canvas || !pad) return;
      // A sharp drawing on high-density screens, capped so the PNG stays small.
      const ratio = Math.min(2, Math.max(window.devicePixelRatio || 1, 1));
      const width = Math.round(canvas.offsetWidth * ratio);
      const height = Math.round(canvas.offsetHeight * ratio);
      if (width === canvas.width && height === canvas.height) return;
      const strokes = pad.toData();
      canvas.width = width;
      canvas.height = height;
      canvas.getContext("2d")?.scale(ratio, ratio);
      pad.fromData(strokes); // clears, then redraws every stroke at its place in CSS pixels
      paint();
    };
    const observer = new ResizeObserver(fit);
    void import("signature_pad").then(({ default: Pad }) => {
      if (cancelled || !canvas) return;
      pad = new Pad(canvas, { penColor: PEN, minWidth: 0.8, maxWidth: 2.6 });
      pad.addEventListener("endStroke", () => setEmpty(pad?.isEmpty() ?? true));
      padRef.current = pad;
      fit();
      observer.observe(canvas);
    });
    return () => {
      cancelled = true;
      observer.disconnect();
      pad?.off();
      padRef.current = null;
    };
  }, [paint]);

  // Switching between drawing and the typed name starts from an empty box.
  const typing = typedName !== null;
  useEffect(() => {
    padRef.current?.clear();
    setEmpty(true);
  }, [typing]);
  useEffect(() => {
    typedRef.current = typedName;
    paint();
  }, [typedName, paint]);

  function clear() {
    padRef.current?.clear();
    setEmpty(true);
  }
  return { canvasRef, padRef, empty, clear };
}
