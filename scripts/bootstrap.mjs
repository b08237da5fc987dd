#!/usr/bin/env node
// Installs what a fresh Debian 12 machine with Node 20 is missing: Debian packages
// (apt-get) and the locked npm packages (npm ci). Plain Node, no dependencies, so it
// runs before node_modules exists. Safe to re-run: it only installs what is absent.
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, readFileSync, statSync } from "node:fs";
import { fileURLToPath } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const withBrowser = process.argv.includes("--with-browser");
const withCluster = process.argv.includes("--with-cluster");

function hasDebianPackage(name) {
  const r = spawnSync("dpkg-query", ["-W", "-f=${Status}", name], { encoding: "utf8" });
  return r.status === 0 && r.stdout.includes("install ok installed");
}

function run(cmd, args, opts = {}) {
  console.log(`$ ${cmd} ${args.join(" ")}`);
  execFileSync(cmd, args, { stdio: "inherit", cwd: root, ...opts });
}

// tesseract-ocr (+ its English data) reads photos and scans of bills; poppler-utils' pdftoppm
// renders a scanned PDF's pages for it. Debian's packages: nothing is downloaded at run time.
// The local cluster (npm run cluster, the cluster fault test) adds HAProxy and rsync (Galera's
// state transfer); galera-4 comes with mariadb-server.
const wanted = [
  "mariadb-server", "mariadb-client", "tesseract-ocr", "tesseract-ocr-eng", "poppler-utils",
  ...(withBrowser ? ["chromium"] : []),
  ...(withCluster ? ["galera-4", "haproxy", "rsync"] : []),
];
const missing = wanted.filter((p) => !hasDebianPackage(p));
if (missing.length > 0) {
  const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
  const sudo = isRoot ? [] : ["sudo"];
  const apt = (args) =>
    sudo.length ? run("sudo", ["apt-get", ...args], { env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } })
      : run("apt-get", args, { env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
  try {
    apt(["update", "-qq"]);
    apt(["install", "-y", "-qq", "--no-install-recommends", ...missing]);
  } catch {
    console.error(`\nCould not install the Debian packages ${missing.join(", ")}.\n` +
      "Run this as root (or with sudo) on Debian 12, or install them yourself and re-run.");
    process.exit(1);
  }
  // Debian's package starts a system MariaDB service; Kilowright runs its own private
  // instance, so the system one is not needed (and is harmless if it keeps running).
}

const lock = path.join(root, "package-lock.json");
const marker = path.join(root, "node_modules", ".package-lock.json");
const stale = !existsSync(marker) || statSync(marker).mtimeMs < statSync(lock).mtimeMs;
if (stale) {
  run("npm", ["ci", "--no-audit", "--no-fund"], {
    env: { ...process.env, PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: "1", NEXT_TELEMETRY_DISABLED: "1" },
  });
}
const pkg = JSON.parse(readFileSync(path.join(root, "package.json"), "utf8"));
const [major, minor] = process.versions.node.split(".").map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(`Kilowright needs Node ${pkg.engines.node}; this is Node ${process.versions.node}.`);
  process.exit(1);
}
