from revolve.cli.app import run

# Guarded: a process pool that starts its workers by "spawn" (macOS, Windows) imports this module
# again in each worker, which must not run the command line.
if __name__ == "__main__":
    run()
