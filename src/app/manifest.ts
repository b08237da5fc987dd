import type { MetadataRoute } from "next";

/** Lets a rep or a crew add Kilowright to a tablet's or phone's home screen (Web App Manifest, W3C). */
export default function manifest(): MetadataRoute.Manifest {
  return {
    name: "Kilowright",
    short_name: "Kilowright",
    description: "From utility bills to a live solar system: design, price, sign, build.",
    start_url: "/",
    scope: "/",
    display: "standalone",
    background_color: "#FAF7F2",
    theme_color: "#FAF7F2",
    icons: [
      { src: "/icon-192.png", sizes: "192x192", type: "image/png" },
      { src: "/icon-512.png", sizes: "512x512", type: "image/png" },
      { src: "/icon.svg", sizes: "any", type: "image/svg+xml" },
    ],
  };
}
