module stereoline

go 1.26.8
