"use client";

/**
 * A button that opens the phone's camera (a file chooser on a computer) for one photo: the
 * crew's job photos and the rep's site photos. The input is emptied after each pick, so the
 * same file can be picked again after a refusal.
 */
export function CameraInput(props: { id: string; label: string; busyLabel: string; busy: boolean; buttonClass: string; onPhoto: (file: File) => void }) {
  return (
    <>
      <label htmlFor={props.id} className={`${props.buttonClass} cursor-pointer ${props.busy ? "opacity-60" : ""}`}>
        {props.busy ? props.busyLabel : props.label}
      </label>
      <input
        id={props.id}
        type="file"
        accept="image/*"
        capture="environment"
        className="sr-only"
        disabled={props.busy}
        onChange={(e) => {
          const input = e.currentTarget;
          const file = input.files?.[0];
          input.value = "";
          if (file) props.onPhoto(file);
        }}
      />
    </>
  );
}
