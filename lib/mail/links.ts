import "server-only";
import { z } from "zod";

const AppUrl = z.string().url("NEXTAUTH_URL must be the absolute URL people reach Sondage on");

/** An absolute link into the app from NEXTAUTH_URL (keeps a base path such as https://firm.example/sondage). */
export function appUrl(path: string): string {
  const base = AppUrl.parse(process.env.NEXTAUTH_URL).replace(/\/+$/, "");
  return `${base}${path.startsWith("/") ? path : `/${path}`}`;
}

export const engagementUrl = (engagementId: number) => appUrl(`/engagements/${engagementId}`);

export const sampleUrl = (engagementId: number, sampleId: number) =>
  appUrl(`/engagements/${engagementId}/samples/${sampleId}`);

export const clientRequestUrl = (listId: number) => appUrl(`/requests/${listId}`);

export const teamRequestUrl = (engagementId: number, sampleId: number, listId: number) =>
  appUrl(`/engagements/${engagementId}/samples/${sampleId}/requests/${listId}`);

export const invitationUrl = (token: string) => appUrl(`/invitation/${token}`);
