/** What the quality flags of a PWV record mean (the service's flags; wording of this page). */
export const FLAG_TEXT: Record<string, string> = {
  ok: 'met measured at the epoch, delay σ known and small',
  'met-interpolated': 'pressure or temperature interpolated in time between two met records',
  'delay-sigma-unknown': 'the delay came without σ: PWV given, its σ unknown',
  'delay-sigma-large': 'delay σ above the limit (default 10 mm of ZTD): left out of hourly means',
  'met-missing': 'no pressure or temperature within the gap limit: no PWV',
};
/** Flags marked on the chart as points of their own. */
export const MARKED_FLAGS = ['delay-sigma-large', 'delay-sigma-unknown'];
