"""Reports for people: the CSV exception list and the console summary."""
