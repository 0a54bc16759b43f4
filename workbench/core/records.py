"""Frozen records built without their field-by-field ``__init__``.

A frozen dataclass's generated ``__init__`` sets every field through ``object.__setattr__``; for the
small records an evaluation makes by the dozen (a step checked, a section's figures, a shaft's
check) that is most of their cost. :func:`built` gives what ``cls(*values)`` gives for a frozen
dataclass with every field passed in field order: the same attributes in the same order, so equal,
hashed, compared and shown alike. Classes with ``__post_init__``, ``InitVar``s, fields left out of
``__init__`` or ``__slots__`` are refused (their ``__init__`` does more than set the fields).
"""

from __future__ import annotations

import dataclasses

_NAMES: dict[type, tuple[str, ...]] = {}


def field_names(cls: type) -> tuple[str, ...]:
    """The field names of the frozen dataclass ``cls`` in order; TypeError for a class whose
    ``__init__`` does more than set its fields."""
    names = _NAMES.get(cls)
    if names is None:
        params = getattr(cls, "__dataclass_params__", None)
        if params is None or not params.frozen:
            raise TypeError(f"{cls.__name__} is not a frozen dataclass")
        fields = dataclasses.fields(cls)
        if (hasattr(cls, "__post_init__") or "__slots__" in cls.__dict__ or any(not f.init for f in fields)
                or any(isinstance(v, dataclasses.InitVar) for v in cls.__annotations__.values())):
            raise TypeError(f"{cls.__name__}: its __init__ does more than set the fields")
        names = _NAMES[cls] = tuple(f.name for f in fields)
    return names


def built(cls: type, *values):
    """``cls(*values)`` for a frozen dataclass, every field given in field order."""
    names = _NAMES.get(cls) or field_names(cls)
    if len(values) != len(names):
        raise TypeError(f"{cls.__name__} takes {len(names)} fields, {len(values)} given")
    obj = object.__new__(cls)
    obj.__dict__.update(zip(names, values))
    return obj


def built_from(cls: type, fields: dict):
    """``cls(**fields)`` for a frozen dataclass, ``fields`` naming every field in field order."""
    names = _NAMES.get(cls) or field_names(cls)
    if tuple(fields) != names:
        raise TypeError(f"{cls.__name__}: fields {tuple(fields)} are not {names} in order")
    obj = object.__new__(cls)
    obj.__dict__.update(fields)
    return obj
