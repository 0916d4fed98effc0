module edgewise

go 1.26
