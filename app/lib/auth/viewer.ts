// The viewer as the browser sees it (no secrets), and a hook for pages under the app layout.
import { useRouteLoaderData } from "react-router";
import type { Role } from "../db/types";
import { can, type Permission } from "./permissions";

export type ClientViewer = { name: string; role: Role; workshop: string; login: string | null; email: string | null };

export function useViewer(): ClientViewer {
  const data = useRouteLoaderData("routes/app-layout") as { viewer: ClientViewer } | undefined;
  if (!data) throw new Error("useViewer outside the app layout");
  return data.viewer;
}

export function useCan(permission: Permission): boolean {
  return can(useViewer().role, permission);
}
