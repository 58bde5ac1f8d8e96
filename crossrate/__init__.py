"""crossrate: predict and check outer-sphere electron-transfer cross rates (Marcus cross relation).

Predictions are estimates, not a safety assessment.
"""

__version__ = "0.1.0"
