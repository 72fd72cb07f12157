"""Writing a reference fixture: the library versions first, then the content, as JSON (shared by the reference scripts)."""
import json
import os
import sys

import numpy as np
import scipy


def write_fixture(default_name, source, generator, content, summary):
    """Write {source, generator, versions, **content} to argv[1] or to default_name next to the scripts; print a line."""
    here = os.path.dirname(os.path.abspath(__file__))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, default_name)
    fixture = {
        "source": source,
        "generator": generator,
        "scipy": scipy.__version__,
        "numpy": np.__version__,
        "python": sys.version.split()[0],
        **content,
    }
    with open(out, "w") as f:
        json.dump(fixture, f, indent=1)
        f.write("\n")
    print(f"wrote {out}: {summary}, scipy {scipy.__version__}")
