"""The project as the window edits it, without Qt: the document model and its change signals, field paths, field specs, display preferences and the crash-recovery file."""
