"""Worker threads for the window: one JobRunner (job ids, stale answers dropped, cancel) and the live solve on it."""
