import type { Knex } from "knex";
import * as platform from "./20261201000000_platform.ts";
import * as accounts from "./20261201000100_accounts.ts";
import * as catalogue from "./20261201000200_catalogue.ts";
import * as mail from "./20261201000210_mail.ts";
import * as sheets from "./20261201000300_sheets.ts";
import * as revisionAuthors from "./20261202000100_revision_authors.ts";
import * as retirement from "./20261202000500_retirement.ts";
import * as forecastCurves from "./20261202001200_forecast_curves.ts";
import * as couplingRange from "./20261202001300_coupling_range.ts";
import * as analysisJobs from "./20261202003000_analysis_jobs.ts";
import * as submissionVersions from "./20261202004000_submission_versions.ts";
import * as sheetRecordKinds from "./20261202004100_sheet_record_kinds.ts";
import * as jobBlobsStorage from "./20261202004500_job_blobs_storage.ts";
import * as remnantMappingKinds from "./20261202005100_remnant_mapping_kinds.ts";
import * as sheetRingdownRecords from "./20261202133000_sheet_ringdown_records.ts";

/**
 * Every migration, in order. Listed explicitly (not read from the folder) so that the same code runs
 * under tsx, vitest and a bundled server; tests/platform/migrations.test.ts fails if a file is missing here.
 */
export const migrations: Record<string, Knex.Migration> = {
  "20261201000000_platform": platform,
  "20261201000100_accounts": accounts,
  "20261201000200_catalogue": catalogue,
  "20261201000210_mail": mail,
  "20261201000300_sheets": sheets,
  "20261202000100_revision_authors": revisionAuthors,
  "20261202000500_retirement": retirement,
  "20261202001200_forecast_curves": forecastCurves,
  "20261202001300_coupling_range": couplingRange,
  "20261202003000_analysis_jobs": analysisJobs,
  "20261202004000_submission_versions": submissionVersions,
  "20261202004100_sheet_record_kinds": sheetRecordKinds,
  "20261202004500_job_blobs_storage": jobBlobsStorage,
  "20261202005100_remnant_mapping_kinds": remnantMappingKinds,
  "20261202133000_sheet_ringdown_records": sheetRingdownRecords,
};
