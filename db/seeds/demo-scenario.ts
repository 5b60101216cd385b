// An invented scenario for the demo only: the firm, clients, people and figures are made up.
import type { FirmRole, Grade, MembershipRole } from "../../lib/auth/roles";

export const DEMO_PASSWORD = "sondage-demo-2026";

export const DEMO_FIRM = { name: "Marrow & Quill Assurance LLP" };

export interface DemoUser {
  key: string;
  name: string;
  email: string;
  grade: Grade;
  firmRole: FirmRole;
}

export const DEMO_USERS: DemoUser[] = [
  { key: "admin", name: "Sam Whitaker", email: "admin@marrow-quill.example", grade: "staff", firmRole: "admin" },
  {
    key: "partner",
    name: "Helena Brandt",
    email: "partner@marrow-quill.example",
    grade: "partner",
    firmRole: "member",
  },
  { key: "manager", name: "Tomás Reyes", email: "manager@marrow-quill.example", grade: "manager", firmRole: "member" },
  { key: "senior", name: "Priya Nair", email: "senior@marrow-quill.example", grade: "senior", firmRole: "member" },
  { key: "senior2", name: "Owen Park", email: "senior2@marrow-quill.example", grade: "senior", firmRole: "member" },
  { key: "staff", name: "Jonah Lindqvist", email: "staff@marrow-quill.example", grade: "staff", firmRole: "member" },
  {
    key: "client",
    name: "Carla Mendes",
    email: "carla.mendes@tessaly-outdoor.example",
    grade: "client",
    firmRole: "member",
  },
];

export interface DemoEngagement {
  key: string;
  clientName: string;
  name: string;
  periodEnd: string;
  currency: string;
  overallMateriality: string;
  performanceMateriality: string;
  status: "planning" | "fieldwork";
  team: Partial<Record<string, MembershipRole>>;
}

export const DEMO_ENGAGEMENTS: DemoEngagement[] = [
  {
    key: "tessaly",
    clientName: "Tessaly Outdoor Supply Inc.",
    name: "Financial statement audit FY2026",
    periodEnd: "2026-09-30",
    currency: "USD",
    overallMateriality: "1200000.00",
    performanceMateriality: "900000.00",
    status: "fieldwork",
    team: { partner: "partner", manager: "manager", senior: "senior", staff: "staff", client: "client" }, // Carla is the client contact: she sees only the request lists sent to her
  },
  {
    key: "bramblecote",
    clientName: "Bramblecote Water Authority",
    name: "Statutory audit FY2026",
    periodEnd: "2026-06-30",
    currency: "USD",
    overallMateriality: "450000.00",
    performanceMateriality: "337500.00",
    status: "planning",
    team: { partner: "partner", manager: "manager", senior2: "senior" },
  },
];
