/**
 * @tropodelay/client: the library under the `tropo-client` command. Connect with `new Service({ baseUrl,
 * key })`, then call the functions below; each takes the Service first and an options object, and
 * reports progress through an optional Progress (progress.ts) instead of writing anywhere itself.
 */

export type { paths as ApiPaths, components as ApiComponents } from './api-types.js';
export type { Answer, Query } from './api.js';
export { Service, ServiceError, type ServiceOptions, type ProblemField } from './service.js';
export { progressFor, SILENT, type Progress, type ProgressMode } from './progress.js';
export { uploadMet, metDaysOf, type MetUploadOptions, type MetUploadResult, type MetRejection } from './met-upload.js';
export {
  depositResiduals,
  listResidualDays,
  listCampaignUploads,
  type CampaignUploadAnswer,
  type ResidualDepositOptions,
  type ResidualDepositResult,
  type ResidualDayAnswer,
  type ResidualDayListing,
} from './residual-deposit.js';
export { runEstimation, contentTypeOf, type EstimationOptions, type EstimationAnswer } from './estimation.js';
export {
  downloadSeries,
  type SeriesDownloadOptions,
  type SeriesDownloadResult,
  type SeriesKind,
  type SeriesFormat,
} from './series-download.js';
export {
  submitCampaign,
  followCampaign,
  cancelCampaign,
  closeCampaignUploads,
  campaignStatus,
  campaignReport,
  listCampaigns,
  type CampaignRequest,
  type CampaignStatus,
  type CampaignReport,
  type CampaignSubmitted,
} from './campaigns.js';
export { InputFileError, splitCsvByDay, splitRinexMetByDay } from './day-split.js';
export { UploadState, defaultStatePath } from './upload-state.js';
export { main as runCommandLine } from './cli.js';
