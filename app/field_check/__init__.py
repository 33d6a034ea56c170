"""The field check's uncertainty in the window: worker.py FieldCheckRunner (first order and Monte
Carlo off the GUI thread, progress, cancel) · panel.py FieldCheckPanel (results with U, guarantees
and their verdicts, measured inputs; rows from app/presentation/uncertainty_table.py)."""
