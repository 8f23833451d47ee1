module finmarch

go 1.26.8
