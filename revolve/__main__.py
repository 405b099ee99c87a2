from revolve.cli.app import main

main()
