"""A faster ``__init__`` for the frozen dataclasses a solve makes by the thousand.

The ``__init__`` that :func:`dataclasses.dataclass` writes for a frozen class sets every field
through ``object.__setattr__`` (about 0.25 µs a field); a year rates its coolers some twenty
thousand times, each sizing making a hot side, a coolant side, one or two zones and an
exchanger. :func:`direct_init` gives such a class an ``__init__`` with the same signature
(field order, defaults, default factories) that fills the instance dictionary directly. Equality,
hashing, ``repr``, :func:`dataclasses.replace`, pickling and the refusal of assignment after
construction are the dataclass's own and unchanged.
"""
from __future__ import annotations

__all__ = ["direct_init"]

import dataclasses


def direct_init(cls):
    """Replace the ``__init__`` of the frozen dataclass ``cls`` by one that fills ``__dict__`` directly.

    Parameters
    ----------
    cls : type
        A ``@dataclass(frozen=True)`` class without ``__post_init__``, ``__slots__`` or
        ``init=False`` fields.

    Returns
    -------
    type
        ``cls`` itself, its ``__init__`` replaced.

    Raises
    ------
    TypeError
        If ``cls`` is not such a class.

    Examples
    --------
    >>> @direct_init
    ... @dataclasses.dataclass(frozen=True)
    ... class Pair:
    ...     a: float
    ...     b: list = dataclasses.field(default_factory=list)
    >>> Pair(1.0), Pair(2.0, [3]) == Pair(2.0, [3])
    (Pair(a=1.0, b=[]), True)
    """
    params = getattr(cls, "__dataclass_params__", None)
    fields = dataclasses.fields(cls) if params is not None else ()
    if (params is None or not params.frozen or hasattr(cls, "__post_init__") or "__slots__" in cls.__dict__
            or any(not f.init for f in fields)):
        raise TypeError(f"direct_init needs a frozen dataclass without __post_init__, slots or init=False "
                        f"fields, not {cls.__name__}")
    env: dict = {"_MISSING": dataclasses.MISSING}
    args, body = [], []
    for f in fields:
        if f.default is not dataclasses.MISSING:
            env[f"_default_{f.name}"] = f.default
            args.append(f"{f.name}=_default_{f.name}")
        elif f.default_factory is not dataclasses.MISSING:
            env[f"_factory_{f.name}"] = f.default_factory
            args.append(f"{f.name}=_MISSING")
            body.append(f"    if {f.name} is _MISSING:\n        {f.name} = _factory_{f.name}()\n")
        else:
            args.append(f.name)
        body.append(f"    d[{f.name!r}] = {f.name}\n")
    source = f"def __init__(self, {', '.join(args)}):\n    d = self.__dict__\n" + "".join(body)
    exec(source, env)  # noqa: S102 - source built above from the dataclass's own field names only
    init = env["__init__"]
    init.__qualname__ = f"{cls.__qualname__}.__init__"
    init.__doc__ = cls.__init__.__doc__
    cls.__init__ = init
    return cls
