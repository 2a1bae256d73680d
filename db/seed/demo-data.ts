/**
 * The invented demo scenario. Every company, supplier and person here is made up; the e-mail
 * domains use the reserved ".example" top-level domain (RFC 2606).
 */
import type { Role } from "@/lib/auth/roles";

/** Demo-only password for every demo account (printed by `npm start`, listed in the README). */
export const DEMO_PASSWORD = "partproof-demo";

export type DemoWorkspace = {
  name: string;
  slug: string;
  people: { email: string; name: string; roles: Role[] }[];
  suppliers: { name: string; contactName: string; contactEmail: string; notes: string }[];
};

export const DEMO_WORKSPACES: DemoWorkspace[] = [
  {
    name: "Vellmoor Spares",
    slug: "vellmoor",
    people: [
      { email: "inspector@vellmoor.example", name: "Ines Kaltenbrunn", roles: ["inspector"] },
      { email: "trainer@vellmoor.example", name: "Tomas Ferreyra", roles: ["trainer"] },
      { email: "auditor@vellmoor.example", name: "Aiko Brandvold", roles: ["auditor"] },
      { email: "lead@vellmoor.example", name: "Lena Okafor-Dahl", roles: ["lead"] },
      { email: "all@vellmoor.example", name: "Sam Allround", roles: ["inspector", "trainer", "auditor", "lead"] },
      { email: "inspector2@vellmoor.example", name: "Piet Moravec", roles: ["inspector"] },
    ],
    suppliers: [
      { name: "Orvane Mobile Supply", contactName: "Dana Whitcombe", contactEmail: "quality@orvane.example", notes: "Camera modules and flex cables; weekly lots." },
      { name: "Lumabay Trading", contactName: "Ravi Solberg", contactEmail: "returns@lumabay.example", notes: "Display assemblies and back housings." },
      { name: "Tamsin Ridge Components", contactName: "Mira Cathcart", contactEmail: "rma@tamsinridge.example", notes: "Batteries and loudspeakers." },
    ],
  },
  {
    name: "Quillfen Device Parts",
    slug: "quillfen",
    people: [
      { email: "lead@quillfen.example", name: "Quinn Harrowgate", roles: ["lead"] },
      { email: "inspector@quillfen.example", name: "Oskar Veldhuis", roles: ["inspector"] },
    ],
    suppliers: [{ name: "Korrelane Reclaim", contactName: "Ada Pellworth", contactEmail: "supply@korrelane.example", notes: "Mixed refurbished parts." }],
  },
];
