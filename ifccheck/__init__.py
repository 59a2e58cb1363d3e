"""ifccheck: checks every timber bending member of an IFC model by allowable stress design.

Results support, and do not replace, review by a licensed engineer under the governing local code.
"""

__version__ = "0.1.0"

CAUTION = (
    "Results support, and do not replace, review by a licensed engineer under the governing local code."
)


def check_model(model_or_path, rules=None):
    """Check a model (path or open ifcopenshell.file); see :func:`ifccheck.checker.check_model`."""
    from .checker import check_model as _check_model

    return _check_model(model_or_path, rules)


__all__ = ["check_model", "CAUTION", "__version__"]
