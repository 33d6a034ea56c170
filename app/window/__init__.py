"""The workbench window.

``main_window``   MainWindow: charts in the middle, panels in docks (one helper), menus, toolbar,
                  status bar; owns the controllers below and stops every worker in closeEvent
``actions``       every command declared once (id, text, shortcut, icon, handler ``target.method``)
``file_ops``      FileController: New/Open/Recent/Save/Save As/Revert, unsaved-changes state
``export_ops``    ExportController: File ▸ Export Report… on a worker thread
``recovery_ops``  RecoveryController: autosave to the recovery file, the restore offer at start
``prompts``       Prompts: every modal question and message box (tests replace its methods)
``editor``        Editor: views → undo commands, problems, debounced solves, results
``commands``      the undo commands (paths and copies, never object references)
``launch``        run_gui: the window, or an offscreen screenshot after the first solve
``help_dialogs``  the safety cautions dialog and the About text
``icons``, ``style``  the window's own icons; its look (Fusion, palette, style sheet)

The staging study's link to the window (status bar) is :mod:`stagewright.gui.study.ops`.
"""
