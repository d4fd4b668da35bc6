/** The folder of records the site is built from: content/records, or another log's folder named by GROUNDWORK_RECORDS. */
export const RECORDS_FOLDER = process.env.GROUNDWORK_RECORDS || 'content/records';
/** A git revision to compare the log with (GROUNDWORK_SINCE): the build then adds a page of the changes since it. */
export const SINCE_REVISION = process.env.GROUNDWORK_SINCE || null;
