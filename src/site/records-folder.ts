/** The folder of records the site is built from: content/records, or another log's folder named by GROUNDWORK_RECORDS. */
export const RECORDS_FOLDER = process.env.GROUNDWORK_RECORDS || 'content/records';
