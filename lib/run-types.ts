import type { Role } from "@/lib/authz";
import type { CheckResult, MeasureResult, SolveSuccess } from "@/solver/types";

// Plain shapes of runs for pages, client components and the JSON API (no Sequelize instances).

import type { ReviewState } from "@/lib/review-states";

export type ReviewStateName = ReviewState;

/** A run as the runs table shows it (no result arrays). */
export type RunSummary = {
  id: string;
  projectId: string;
  title: string;
  authorId: string;
  authorName: string;
  createdAt: string;
  status: string;
  reviewState: ReviewStateName;
  checksPassed: number | null;
  checksTotal: number | null;
  measures: MeasureResult[];
  supersedesId: string | null;
};

export type ReviewEventView = {
  id: string;
  action: string;
  note: string | null;
  actorName: string;
  createdAt: string;
};

/** Everything the run page and `GET /api/runs/:id` show. */
export type RunDetail = RunSummary & {
  netlist: string;
  netlistHash: string;
  solverVersion: string;
  result: SolveSuccess | null;
  checks: CheckResult[];
  timings: Record<string, number> | null;
  project: { id: string; name: string; teamId: string; teamName: string };
  role: Role;
  permissions: { comment: boolean; review: boolean; askSignOff: boolean; createRun: boolean };
  reviewEvents: ReviewEventView[];
  supersedes: { id: string; title: string } | null;
  supersededBy: { id: string; title: string }[];
};

export type RunListPage = {
  runs: RunSummary[];
  total: number;
  page: number;
  pageSize: number;
  pages: number;
};
