"""The workbench window: main window, actions, editor, undo commands, file/export/recovery operations, help, icons and style."""
