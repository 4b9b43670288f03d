/** App-level state outside any project: the crash-recovery copy and the recent-files list. */
export { createRecoveryStore, RECOVERY_FILE_NAME, RECOVERY_FORMAT, type RecoveryStore } from './recovery';
export { createRecentFiles, RECENT_FILE_NAME, RECENT_FORMAT, type RecentFiles } from './recentFiles';
