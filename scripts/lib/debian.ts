import { capture, findBinary, runLive } from "./proc";
import { say } from "./log";

/** A Debian package and the binaries whose presence shows it is installed. */
export interface DebianNeed {
  pkg: string;
  binaries: string[];
}

export const MARIADB: DebianNeed = { pkg: "mariadb-server", binaries: ["mariadbd", "mariadb-install-db", "mariadb", "mariadb-admin"] };
export const CHROMIUM: DebianNeed = { pkg: "chromium", binaries: ["chromium"] };

export class MissingPackageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "MissingPackageError";
  }
}

const isRoot = () => typeof process.getuid === "function" && process.getuid() === 0;

function missing(needs: DebianNeed[]): DebianNeed[] {
  return needs.filter((n) => n.binaries.some((b) => findBinary(b) === null));
}

async function hasCandidate(pkg: string): Promise<boolean> {
  const r = await capture("apt-cache", ["policy", pkg]);
  return r.code === 0 && /Candidate: (?!\(none\))/.test(r.stdout);
}

/**
 * Installs the Debian packages whose binaries are missing: with apt-get when we are root,
 * otherwise stops with the exact command to run. Waits for another apt run's lock instead of failing.
 */
export async function ensureDebianPackages(needs: DebianNeed[]): Promise<void> {
  const todo = missing(needs);
  if (todo.length === 0) return;
  const pkgs = todo.map((n) => n.pkg);
  const command = `sudo apt-get update && sudo apt-get install -y ${pkgs.join(" ")}`;
  if (!isRoot()) {
    throw new MissingPackageError(`Debian package(s) ${pkgs.join(", ")} are needed. Install them with:\n  ${command}`);
  }
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const lock = ["-o", "DPkg::Lock::Timeout=300"];
  let known = true;
  for (const p of pkgs) if (!(await hasCandidate(p))) known = false;
  if (!known) {
    say("apt-get update (package lists are missing or old)");
    const code = await runLive("apt-get", [...lock, "update", "-q"], { env });
    if (code !== 0) throw new MissingPackageError(`apt-get update failed (exit ${code}). Run yourself:\n  ${command}`);
  }
  say(`apt-get install -y ${pkgs.join(" ")}`);
  const code = await runLive("apt-get", [...lock, "install", "-y", "-q", ...pkgs], { env });
  const still = missing(todo);
  if (code !== 0 || still.length > 0) {
    const why = code !== 0 ? `apt-get exit ${code}` : `still missing: ${still.flatMap((n) => n.binaries.filter((b) => findBinary(b) === null)).join(", ")}`;
    throw new MissingPackageError(`Installing ${pkgs.join(", ")} failed (${why}). Run yourself:\n  ${command}`);
  }
}
