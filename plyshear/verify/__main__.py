"""`python -m plyshear.verify`: run the cases and write docs/verification.md."""

import sys

from plyshear.verify import main

sys.exit(main())
