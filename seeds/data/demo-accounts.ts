import type { Role } from "../../server/http/identity.ts";

/**
 * The invented people of the demo. The seed creates them in the database and the local fake GitHub
 * (fakes/github.ts) knows the same list, so signing in as one of them lands on the seeded row.
 */
export interface DemoAccount {
  githubId: number;
  login: string;
  name: string;
  email: string;
  roles: Role[];
  /** One line for the fake's pick page. */
  blurb: string;
}

export const demoAccounts: readonly DemoAccount[] = [
  {
    githubId: 910001,
    login: "demo-admin",
    name: "Ilse Marrow",
    email: "ilse.marrow@demo.dragoman.invalid",
    roles: ["admin", "editor"],
    blurb: "runs the site and reviews submissions",
  },
  {
    githubId: 910002,
    login: "demo-editor",
    name: "Tomasz Quell",
    email: "tomasz.quell@demo.dragoman.invalid",
    roles: ["editor"],
    blurb: "reviews and publishes theory mappings",
  },
  {
    githubId: 910003,
    login: "demo-theorist",
    name: "Amara Venn",
    email: "amara.venn@demo.dragoman.invalid",
    roles: ["contributor"],
    blurb: "submits mappings for scalar-Gauss-Bonnet models",
  },
  {
    githubId: 910004,
    login: "demo-analyst",
    name: "Ruairi Falk",
    email: "ruairi.falk@demo.dragoman.invalid",
    roles: ["analyst"],
    blurb: "turns deviation bounds into coupling limits",
  },
  {
    githubId: 910005,
    login: "demo-reader",
    name: "Noor Halvorsen",
    email: "noor.halvorsen@demo.dragoman.invalid",
    roles: [],
    blurb: "reads the catalogue, no role beyond reader",
  },
];
