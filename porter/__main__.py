import sys

from porter.cli import main

sys.exit(main())
