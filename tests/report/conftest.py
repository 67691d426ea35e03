from tests.runner.conftest import tiny_dir, tiny_env  # noqa: F401  (fixtures shared with the runner tests)
